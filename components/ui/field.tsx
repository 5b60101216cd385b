import { forwardRef, useId } from "react";

const control = "w-full rounded-md border border-ink-line bg-paper-raised px-3 py-2 text-sm text-ink placeholder:text-ink-faint focus:border-ledger-500 focus:outline-none focus:ring-2 focus:ring-ledger-100 aria-[invalid=true]:border-brick-500";

interface FieldProps { label: string; error?: string; hint?: string; children: (ids: { id: string; describedBy?: string; invalid: boolean }) => React.ReactNode }

/** A labelled control with its hint and an accessible error (aria-describedby, announced politely). */
export function Field({ label, error, hint, children }: FieldProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = `${id}-error`;
  const describedBy = [hintId, error ? errorId : undefined].filter(Boolean).join(" ") || undefined;
  return (
    <div className="space-y-1.5">
      <label htmlFor={id} className="block text-sm font-medium text-ink">{label}</label>
      {children({ id, describedBy, invalid: Boolean(error) })}
      {hint && <p id={hintId} className="text-xs text-ink-faint">{hint}</p>}
      <p id={errorId} aria-live="polite" className="min-h-4 text-xs text-brick-700">{error}</p>
    </div>
  );
}

export const Input = forwardRef<HTMLInputElement, React.InputHTMLAttributes<HTMLInputElement>>(function Input({ className = "", ...props }, ref) {
  return <input ref={ref} className={`${control} ${className}`} {...props} />;
});

export const Select = forwardRef<HTMLSelectElement, React.SelectHTMLAttributes<HTMLSelectElement>>(function Select({ className = "", ...props }, ref) {
  return <select ref={ref} className={`${control} ${className}`} {...props} />;
});
