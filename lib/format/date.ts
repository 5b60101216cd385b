/**
 * How Sondage prints dates and times — one style for each, on every screen, in the workbook, the PDF
 * and e-mail: a date reads "31 Dec 2026"; an instant reads "2 Dec 2026, 09:05 UTC", always in UTC so
 * every reader of a workpaper or e-mail sees the same instant, and always naming the zone.
 * Written out by hand rather than through Intl, whose month abbreviations differ between ICU versions
 * (Node's en-GB says "Sept"), so the server and the browser print the same text.
 */

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"] as const;
const YMD = /^\d{4}-\d{2}-\d{2}$/;
const two = (n: number) => String(n).padStart(2, "0");

type When = Date | string | null | undefined;

function toDate(value: Date | string, field: string): Date {
  const date = value instanceof Date ? value : new Date(YMD.test(value) ? `${value}T00:00:00Z` : value);
  if (Number.isNaN(date.getTime())) throw new RangeError(`${field}: not a date (${String(value)})`);
  return date;
}

/** "2026-12-31" (a calendar date, no time zone shift) or an instant → "31 Dec 2026"; nothing → "—". */
export function formatDate(value: When, field = "date"): string {
  if (value == null || value === "") return "—";
  if (typeof value === "string" && !YMD.test(value) && !/T/.test(value))
    throw new RangeError(`${field} must be YYYY-MM-DD, got "${value}"`);
  const d = toDate(value, field);
  return `${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]} ${d.getUTCFullYear()}`;
}

/** "2026-12-02T09:05:09.000Z" → "2 Dec 2026, 09:05 UTC"; nothing → "—". */
export function formatDateTime(value: When, field = "at"): string {
  if (value == null || value === "") return "—";
  const d = toDate(value, field);
  return `${formatDate(d)}, ${two(d.getUTCHours())}:${two(d.getUTCMinutes())} UTC`;
}
