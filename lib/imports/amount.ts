import "server-only";

/** "dot-decimal" reads 1,234.56; "comma-decimal" reads 1.234,56. */
export type NumberFormat = "dot-decimal" | "comma-decimal";

export type AmountProblemKind = "blank" | "not-a-number" | "too-many-decimals" | "out-of-range";

export type AmountResult = { ok: true; cents: bigint } | { ok: false; kind: AmountProblemKind; detail: string };

/** DECIMAL(18,2): 16 integer digits, 2 decimals. */
export const MAX_INTEGER_DIGITS = 16;
export const MAX_ABS_CENTS = 10n ** 18n - 1n;

// Codes printed beside amounts in ledger exports (ISO 4217 codes; common practice to accept a short list
// rather than any three letters, so "INV123" is never read as 123).
const CURRENCY_CODES = ["USD", "EUR", "GBP", "CHF", "CAD", "AUD", "NZD", "JPY", "SEK", "NOK", "DKK"];
const CURRENCY_PREFIX = new RegExp(`^(?:[$€£¥]|${CURRENCY_CODES.join("|")})`, "i");
const CURRENCY_SUFFIX = new RegExp(`(?:[$€£¥]|${CURRENCY_CODES.join("|")})$`, "i");

const BODY: Record<NumberFormat, RegExp> = {
  "dot-decimal": /^(\d+|\d{1,3}(?:,\d{3})+)?(?:\.(\d*))?$/,
  "comma-decimal": /^(\d+|\d{1,3}(?:\.\d{3})+)?(?:,(\d*))?$/,
};

// Fast path for the common "-1234.56" (at most 16 integer digits, 2 decimals), same result as the full parse.
const PLAIN: Record<NumberFormat, RegExp> = {
  "dot-decimal": /^(-?)(\d{1,16})(?:\.(\d{1,2}))?$/,
  "comma-decimal": /^(-?)(\d{1,16})(?:,(\d{1,2}))?$/,
};

export interface AmountParts {
  negative: boolean;
  body: string;
}

/**
 * Peels spaces (incl. non-breaking), currency symbols/codes, a leading or trailing minus and
 * accounting parentheses off an amount, leaving the digits and separators. Returns null when
 * the signs contradict each other (e.g. "-(5)").
 */
export function splitAmount(raw: string): AmountParts | null {
  let s = raw.replace(/\s+/g, "");
  let negatives = 0;
  let prefixDone = false;
  let suffixDone = false;
  for (let pass = 0; pass < 3; pass += 1) {
    if (!prefixDone && CURRENCY_PREFIX.test(s)) {
      s = s.replace(CURRENCY_PREFIX, "");
      prefixDone = true;
    }
    if (!suffixDone && CURRENCY_SUFFIX.test(s)) {
      s = s.replace(CURRENCY_SUFFIX, "");
      suffixDone = true;
    }
    if (s.length > 1 && s.startsWith("(") && s.endsWith(")")) {
      s = s.slice(1, -1);
      negatives += 1;
    } else if (s.startsWith("-") || s.endsWith("-")) {
      s = s.startsWith("-") ? s.slice(1) : s.slice(0, -1);
      negatives += 1;
    } else if (s.startsWith("+")) {
      s = s.slice(1);
    }
  }
  if (negatives > 1) return null;
  return { negative: negatives === 1, body: s };
}

/**
 * Parses a ledger amount to exact integer cents by string manipulation (never through a float).
 * Accepts 1,234.56 / 1.234,56 (per `format`), (1,234.56), -1234.56, 1234.56-, currency symbols
 * and codes, spaces and non-breaking spaces. Decimals beyond the second must be zeros.
 * @example parseAmountToCents("(1.234,56 €)", "comma-decimal") // { ok: true, cents: -123456n }
 */
export function parseAmountToCents(raw: string, format: NumberFormat): AmountResult {
  const plain = PLAIN[format].exec(raw);
  if (plain) {
    const magnitude = BigInt(plain[2] + (plain[3] ?? "").padEnd(2, "0"));
    return { ok: true, cents: plain[1] ? -magnitude : magnitude };
  }
  if (raw.trim() === "") return { ok: false, kind: "blank", detail: "is blank" };
  const parts = splitAmount(raw);
  const match = parts ? BODY[format].exec(parts.body) : null;
  if (!parts || !match || (match[1] === undefined && !match[2])) {
    return { ok: false, kind: "not-a-number", detail: `is not a number in the ${format} format` };
  }
  const integer = (match[1] ?? "0").replace(/[.,]/g, "").replace(/^0+(?=\d)/, "");
  let fraction = match[2] ?? "";
  if (fraction.length > 2) {
    if (/[^0]/.test(fraction.slice(2))) {
      return {
        ok: false,
        kind: "too-many-decimals",
        detail: `has ${fraction.length} decimal places; at most 2 are allowed`,
      };
    }
    fraction = fraction.slice(0, 2);
  }
  if (integer.length > MAX_INTEGER_DIGITS) {
    return {
      ok: false,
      kind: "out-of-range",
      detail: "is larger than 9,999,999,999,999,999.99, the largest amount accepted",
    };
  }
  const magnitude = BigInt(integer + fraction.padEnd(2, "0"));
  return { ok: true, cents: parts.negative ? -magnitude : magnitude };
}

/**
 * Cents as a plain decimal string with two places, as MariaDB DECIMAL accepts it.
 * @example formatCents(-123456n) // "-1234.56"
 */
export function formatCents(cents: bigint): string {
  const negative = cents < 0n;
  const digits = (negative ? -cents : cents).toString().padStart(3, "0");
  return `${negative ? "-" : ""}${digits.slice(0, -2)}.${digits.slice(-2)}`;
}
