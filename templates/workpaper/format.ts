/** Printing helpers for the workpaper: exact decimal strings in, display strings out. */
import type { Money } from "./workpaper-data";

const MINUS = "\u2212";

/** "1234567.8" → "1,234,567.80"; "-12" → "−12.00". Works on the decimal text, never on floats. */
export function formatMoney(value: Money | null | undefined): string {
  if (value === null || value === undefined || value === "") return "—";
  const text = value.trim();
  const match = /^(-)?(\d+)(?:\.(\d*))?$/.exec(text);
  if (!match) throw new RangeError(`money must be a decimal string, got "${value}"`);
  const whole = match[2].replace(/^0+(?=\d)/, "").replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  const frac = (match[3] ?? "").padEnd(2, "0").slice(0, 2);
  const zero = /^[0,]+$/.test(whole) && /^0+$/.test(frac);
  return `${match[1] && !zero ? MINUS : ""}${whole}.${frac}`;
}

/** A fraction as a percentage: 0.0475 → "4.75%" (digits after the point configurable). */
export function formatRate(fraction: number, digits = 2): string {
  return `${(fraction * 100).toFixed(digits)}%`;
}

/** A factor or quantile: fixed decimals with a true minus sign. */
export function formatFactor(value: number, digits = 4): string {
  const text = value.toFixed(digits);
  return text.startsWith("-") ? MINUS + text.slice(1) : text;
}

/** "2026-12-02T14:05:09.000Z" → "2026-12-02 14:05 UTC". */
export function formatTime(iso: string | null | undefined): string {
  if (!iso) return "—";
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) throw new RangeError(`time must be ISO 8601, got "${iso}"`);
  return `${date.toISOString().slice(0, 16).replace("T", " ")} UTC`;
}

/** "2026-12-31" → "31 December 2026". */
export function formatDate(ymd: string): string {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(ymd);
  if (!match) throw new RangeError(`date must be YYYY-MM-DD, got "${ymd}"`);
  const months = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];
  return `${Number(match[3])} ${months[Number(match[2]) - 1]} ${match[1]}`;
}

/** A plan parameter value printed by its kind. */
export function formatByKind(kind: "money" | "rate" | "count" | "text" | "factor", value: string): string {
  switch (kind) {
    case "money": return formatMoney(value);
    case "rate": return formatRate(Number(value), rateDigits(Number(value)));
    case "count": return Number(value).toLocaleString("en-US");
    case "factor": return value;
    default: return value;
  }
}

function rateDigits(fraction: number): number {
  const pct = fraction * 100;
  return Math.abs(pct - Math.round(pct)) < 1e-9 ? 0 : Math.abs(pct * 10 - Math.round(pct * 10)) < 1e-9 ? 1 : 2;
}

/** Whether a decimal string is negative (for colouring), without parsing to a float. */
export function isNegative(value: Money | null): boolean {
  return value !== null && /^-(?!0*(\.0*)?$)/.test(value.trim());
}
