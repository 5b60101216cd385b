import { useId } from "react";
import { Button } from "./button";

/** A button that, when it cannot be used, looks disabled and says why beside it (read out with it). */
export function ExplainedButton({ why, children, ...props }: React.ComponentProps<typeof Button> & { why?: string }) {
  const id = useId();
  return (
    <span className="inline-flex flex-col gap-1">
      <Button {...props} aria-describedby={why ? id : undefined}>
        {children}
      </Button>
      {why && (
        <span id={id} className="max-w-48 text-xs text-ink-soft">
          {why}
        </span>
      )}
    </span>
  );
}
