"use client";
import { createContext, forwardRef, useContext, useId } from "react";

const control =
  "w-full rounded-md border border-ink-line bg-paper-raised px-3 py-2 text-sm text-ink placeholder:text-ink-faint focus:border-ledger-500 focus:outline-none focus:ring-2 focus:ring-ledger-100 aria-[invalid=true]:border-brick-500";

/** What a `Field` tells the one control inside it: its id, what describes it, whether it is invalid. */
interface FieldControl {
  id: string;
  describedBy?: string;
  invalid: boolean;
}

const FieldContext = createContext<FieldControl | null>(null);

interface FieldProps {
  label: string;
  error?: string;
  hint?: string;
  children: React.ReactNode;
}

/**
 * A labelled control with its hint and an accessible error (aria-describedby, announced politely).
 * The `Input`, `Select` or `Textarea` inside takes its id, aria-describedby and aria-invalid from
 * the field; props given to the control itself win.
 */
export function Field({ label, error, hint, children }: FieldProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = `${id}-error`;
  const describedBy = [hintId, error ? errorId : undefined].filter(Boolean).join(" ") || undefined;
  return (
    <div className="space-y-1.5">
      <label htmlFor={id} className="block text-sm font-medium text-ink">
        {label}
      </label>
      <FieldContext.Provider value={{ id, describedBy, invalid: Boolean(error) }}>{children}</FieldContext.Provider>
      {hint && (
        <p id={hintId} className="text-xs text-ink-faint">
          {hint}
        </p>
      )}
      <p id={errorId} aria-live="polite" className="min-h-4 text-xs text-brick-700">
        {error}
      </p>
    </div>
  );
}

interface AriaProps {
  id?: string;
  "aria-describedby"?: string;
  "aria-invalid"?: React.AriaAttributes["aria-invalid"];
}

/** The id and aria attributes of a control: its own when given, else its field's. */
function useFieldProps(own: AriaProps): AriaProps {
  const field = useContext(FieldContext);
  if (!field) return {};
  return {
    id: own.id ?? field.id,
    "aria-describedby": own["aria-describedby"] ?? field.describedBy,
    "aria-invalid": own["aria-invalid"] ?? field.invalid,
  };
}

export const Input = forwardRef<HTMLInputElement, React.InputHTMLAttributes<HTMLInputElement>>(function Input(
  { className = "", ...props },
  ref,
) {
  return <input ref={ref} className={`${control} ${className}`} {...props} {...useFieldProps(props)} />;
});

export const Select = forwardRef<HTMLSelectElement, React.SelectHTMLAttributes<HTMLSelectElement>>(function Select(
  { className = "", ...props },
  ref,
) {
  return <select ref={ref} className={`${control} ${className}`} {...props} {...useFieldProps(props)} />;
});

export const Textarea = forwardRef<HTMLTextAreaElement, React.TextareaHTMLAttributes<HTMLTextAreaElement>>(
  function Textarea({ className = "", ...props }, ref) {
    return <textarea ref={ref} className={`${control} ${className}`} {...props} {...useFieldProps(props)} />;
  },
);
