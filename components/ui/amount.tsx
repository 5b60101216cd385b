/** A money amount in tabular figures, right-aligned by its container. `value` is a decimal string or number. */
export function Amount({ value, currency }: { value: string | number; currency?: string }) {
  return (
    <span className="figures whitespace-nowrap">
      {currency && <span className="mr-1 text-ink-faint">{currency}</span>}
      {formatAmount(value)}
    </span>
  );
}

export function formatAmount(value: string | number): string {
  const text = typeof value === "number" ? value.toFixed(2) : value;
  const negative = text.startsWith("-");
  const [whole, frac = "00"] = (negative ? text.slice(1) : text).split(".");
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  return `${negative ? "−" : ""}${grouped}.${frac.padEnd(2, "0").slice(0, 2)}`;
}
