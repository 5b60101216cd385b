/**
 * The product's one date format, the same on screens, e-mails, the workbook and the PDF, and the
 * same on the server and in the browser: "3 December 2026", and "3 December 2026, 14:05 UTC" where a time is
 * shown (times are kept and shown in UTC, said so beside them).
 */
const MONTHS = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];

function toDate(value: string | Date): Date | null {
  const d = value instanceof Date ? value : /^\d{4}-\d{2}-\d{2}$/.test(value) ? new Date(`${value}T00:00:00Z`) : new Date(value);
  return Number.isNaN(d.getTime()) ? null : d;
}

/** "2026-09-30" or an instant → "30 September 2026" (the UTC calendar day). */
export function formatDate(value: string | Date | null | undefined): string {
  const d = value == null ? null : toDate(value);
  return d ? `${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]} ${d.getUTCFullYear()}` : "—";
}

/** An instant → "3 December 2026, 14:05 UTC". */
export function formatDateTime(value: string | Date | null | undefined): string {
  const d = value == null ? null : toDate(value);
  if (!d) return "—";
  const hh = String(d.getUTCHours()).padStart(2, "0");
  const mm = String(d.getUTCMinutes()).padStart(2, "0");
  return `${formatDate(d)}, ${hh}:${mm} UTC`;
}
