import { formatMoney } from "@/lib/format/number";

/** A money amount in tabular figures, right-aligned by its container. `value` is a decimal string or number. */
export function Amount({ value, currency }: { value: string | number; currency?: string }) {
  return (
    <span className="figures whitespace-nowrap">
      {currency && <span className="mr-1 text-ink-faint">{currency}</span>}
      {formatMoney(value)}
    </span>
  );
}
