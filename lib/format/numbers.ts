/** Counts as the rest of the product prints them: "1,234". */
export const formatCount = (n: number) => n.toLocaleString("en-US");

/** "1 item", "2 items", "1,204 items" — never "1 items". `plural` defaults to singular + "s". */
export function countOf(n: number, singular: string, plural = `${singular}s`): string {
  return `${formatCount(n)} ${n === 1 ? singular : plural}`;
}

/** A money amount as the product prints it: "1,234.50", a true minus sign for negatives. */
export function formatAmount(value: string | number): string {
  const text = typeof value === "number" ? value.toFixed(2) : value;
  const negative = text.startsWith("-");
  const [whole, frac = "00"] = (negative ? text.slice(1) : text).split(".");
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  return `${negative ? "−" : ""}${grouped}.${frac.padEnd(2, "0").slice(0, 2)}`;
}
