import { forwardRef } from "react";
import { Input } from "@/components/ui/field";

/** A rate typed as a percent ("95"), with the sign shown beside it; the form converts it to a fraction. */
export const PercentInput = forwardRef<HTMLInputElement, React.InputHTMLAttributes<HTMLInputElement>>(
  function PercentInput(props, ref) {
    return (
      <div className="relative">
        <Input ref={ref} inputMode="decimal" className="figures pr-8 text-right" {...props} />
        <span
          aria-hidden
          className="pointer-events-none absolute inset-y-0 right-3 flex items-center text-sm text-ink-faint"
        >
          %
        </span>
      </div>
    );
  },
);
