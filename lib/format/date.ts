/** How Sondage prints dates and times: always in UTC, so every reader of a workpaper or e-mail sees the same instant. */

const WHEN = new Intl.DateTimeFormat("en-GB", { dateStyle: "long", timeStyle: "short", timeZone: "UTC" });
const LONG_DAY = new Intl.DateTimeFormat("en-GB", { dateStyle: "long", timeZone: "UTC" });
const SHORT_DAY = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
const YMD = /^\d{4}-\d{2}-\d{2}$/;

function toDate(value: Date | string, field: string): Date {
  const date = value instanceof Date ? value : new Date(YMD.test(value) ? `${value}T00:00:00Z` : value);
  if (Number.isNaN(date.getTime())) throw new RangeError(`${field}: not a date (${String(value)})`);
  return date;
}

/** "2026-12-02T14:05:09.000Z" → "2026-12-02 14:05 UTC" (tables, trails); null → "—". */
export function formatTime(value: Date | string | null | undefined): string {
  if (!value) return "—";
  return `${toDate(value, "time").toISOString().slice(0, 16).replace("T", " ")} UTC`;
}

/** "2 December 2026 at 09:05 UTC" (sentences, e-mail). */
export function formatWhen(value: Date | string, field = "at"): string {
  return `${WHEN.format(toDate(value, field))} UTC`;
}

/** "2026-12-31" → "31 December 2026" (a calendar date, no time zone shift). */
export function formatDate(value: Date | string, field = "date"): string {
  if (typeof value === "string" && !YMD.test(value) && !/T/.test(value)) throw new RangeError(`${field} must be YYYY-MM-DD, got "${value}"`);
  return LONG_DAY.format(toDate(value, field));
}

/** "2026-12-31" → "31 Dec 2026" (dense lists). */
export function formatShortDate(value: Date | string, field = "date"): string {
  return SHORT_DAY.format(toDate(value, field));
}
