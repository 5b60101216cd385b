/**
 * How Sondage prints numbers, on screens, in workbooks' text and in PDFs: one Intl.NumberFormat per
 * kind, en-US grouping, and the true minus sign (U+2212) for negatives. Money is formatted from its
 * exact decimal text (Intl formats numeric strings without going through a float).
 */
export const MINUS = "\u2212";

const MONEY = new Intl.NumberFormat("en-US", {
  minimumFractionDigits: 2,
  maximumFractionDigits: 2,
  signDisplay: "negative",
});
const COUNT = new Intl.NumberFormat("en-US", { maximumFractionDigits: 0 });
const DECIMAL_TEXT = /^-?\d+(?:\.\d*)?$/;

const trueMinus = (text: string) => (text.startsWith("-") ? MINUS + text.slice(1) : text);

/** "1234567.8" → "1,234,567.80"; "-12" → "−12.00"; null or "" → "—". Strings must be decimal text. */
export function formatMoney(value: string | number | null | undefined): string {
  if (value === null || value === undefined || value === "") return "—";
  if (typeof value === "number") {
    if (!Number.isFinite(value)) throw new RangeError(`money must be a finite number, got ${value}`);
    return trueMinus(MONEY.format(value));
  }
  const text = value.trim();
  if (!DECIMAL_TEXT.test(text)) throw new RangeError(`money must be a decimal string, got "${value}"`);
  return trueMinus(MONEY.format(text as Intl.StringNumericLiteral));
}

/** Whether a decimal string is negative (for colouring), without parsing to a float; "-0.00" is not. */
export function isNegative(value: string | null): boolean {
  return value !== null && /^-(?!0*(\.0*)?$)/.test(value.trim());
}

/** A fraction as a percentage with fixed digits: 0.0475 → "4.75%". */
export function formatRate(fraction: number, digits = 2): string {
  return `${trueMinus((fraction * 100).toFixed(digits))}%`;
}

/** A fraction as a percentage with as few digits as it needs (0, 1 or 2): 0.95 → "95%"; 0.0125 → "1.25%". */
export function formatPercent(fraction: number, digits?: number): string {
  return formatRate(fraction, digits ?? percentDigits(fraction));
}

export function percentDigits(fraction: number): number {
  const pct = fraction * 100;
  return Math.abs(pct - Math.round(pct)) < 1e-9 ? 0 : Math.abs(pct * 10 - Math.round(pct * 10)) < 1e-9 ? 1 : 2;
}

/** A factor or quantile: fixed decimals with a true minus sign. */
export function formatFactor(value: number, digits = 4): string {
  return trueMinus(value.toFixed(digits));
}

/** A count of items: 1234567 → "1,234,567". */
export function formatCount(n: number): string {
  return trueMinus(COUNT.format(n));
}

/** "1 item", "2 items", "1,204 items" — never "1 items". `plural` defaults to singular + "s". */
export function countOf(n: number, singular: string, plural = `${singular}s`): string {
  return `${formatCount(n)} ${n === 1 ? singular : plural}`;
}

/** A plain figure with fixed decimals and grouping: 1234.5 → "1,234.50". */
export function formatNumber(n: number, digits = 2): string {
  return trueMinus(n.toLocaleString("en-US", { minimumFractionDigits: digits, maximumFractionDigits: digits }));
}

/** 1,536 → "1.5 KB"; binary multiples, as file managers show them. */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  const units = ["KB", "MB", "GB"];
  let value = bytes / 1024;
  let unit = 0;
  while (value >= 1024 && unit < units.length - 1) {
    value /= 1024;
    unit += 1;
  }
  return `${value.toFixed(value < 10 ? 1 : 0)} ${units[unit]}`;
}
