import { forwardRef } from "react";

type Variant = "primary" | "secondary" | "ghost" | "danger";

const variants: Record<Variant, string> = {
  primary:
    "bg-ledger-600 text-white hover:bg-ledger-700 disabled:bg-paper-sunk disabled:text-ink-soft disabled:border disabled:border-dashed disabled:border-ink-line",
  secondary:
    "bg-paper-raised text-ink border border-ink-line hover:bg-paper-sunk disabled:bg-paper-sunk disabled:text-ink-soft disabled:border-dashed",
  ghost: "text-ink-soft hover:bg-paper-sunk hover:text-ink disabled:text-ink-faint",
  danger:
    "bg-brick-500 text-white hover:bg-brick-700 disabled:bg-paper-sunk disabled:text-ink-soft disabled:border disabled:border-dashed disabled:border-ink-line",
};

export function buttonClass(variant: Variant = "primary", extra = "") {
  return `inline-flex items-center justify-center gap-2 rounded-md px-3.5 py-2 text-sm font-medium transition-colors disabled:cursor-not-allowed ${variants[variant]} ${extra}`;
}

export const Button = forwardRef<
  HTMLButtonElement,
  React.ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }
>(function Button({ variant = "primary", className = "", ...props }, ref) {
  return <button ref={ref} className={buttonClass(variant, className)} {...props} />;
});
