// How dates read in e-mail: spelled-out months, in UTC so every recipient sees the same instant.

const WHEN = new Intl.DateTimeFormat("en-GB", { dateStyle: "long", timeStyle: "short", timeZone: "UTC" });
const DAY = new Intl.DateTimeFormat("en-GB", { dateStyle: "long", timeZone: "UTC" });

function toDate(value: Date | string, field: string): Date {
  const date = value instanceof Date ? value : new Date(value);
  if (Number.isNaN(date.getTime())) throw new TypeError(`${field}: not a date (${String(value)})`);
  return date;
}

/** "2 December 2026 at 09:05 UTC" */
export function formatWhen(value: Date | string, field = "at"): string {
  return `${WHEN.format(toDate(value, field))} UTC`;
}

/** "31 December 2026" from "2026-12-31" (a calendar date, no time zone shift). */
export function formatDay(isoDay: string, field = "periodEnd"): string {
  return DAY.format(toDate(/^\d{4}-\d{2}-\d{2}$/.test(isoDay) ? `${isoDay}T00:00:00Z` : isoDay, field));
}

/** Wraps a paragraph for the plain-text part at about 72 columns; long words (links) stay whole. */
export function wrapText(text: string, width = 72, indent = ""): string {
  return text.split("\n").map((line) => {
    const out: string[] = [];
    let current = "";
    for (const word of line.split(/ +/)) {
      if (current && current.length + 1 + word.length > width - indent.length) {
        out.push(current);
        current = word;
      } else current = current ? `${current} ${word}` : word;
    }
    out.push(current);
    return out.map((l) => indent + l).join("\n");
  }).join("\n");
}
