import "server-only";
import { splitAmount, type NumberFormat } from "./amount";

/**
 * Which number format a sample of amounts is written in, or null when nothing in the sample
 * decides it (integers only, or only values like "1,234" that read either way).
 * A value with both separators votes for the one written last as the decimal mark; a single
 * separator followed by 1–2 or 4+ digits is a decimal mark; repeated separators are grouping.
 */
export function detectNumberFormat(values: Iterable<string>): NumberFormat | null {
  let dot = 0;
  let comma = 0;
  for (const value of values) {
    const vote = voteFor(value);
    if (vote === "dot-decimal") dot += 1;
    else if (vote === "comma-decimal") comma += 1;
  }
  if (dot === 0 && comma === 0) return null;
  return comma > dot ? "comma-decimal" : "dot-decimal";
}

function voteFor(value: string): NumberFormat | null {
  const parts = splitAmount(value);
  if (!parts || !/^[\d.,]+$/.test(parts.body) || !/\d/.test(parts.body)) return null;
  const body = parts.body;
  const lastDot = body.lastIndexOf(".");
  const lastComma = body.lastIndexOf(",");
  if (lastDot >= 0 && lastComma >= 0) return lastDot > lastComma ? "dot-decimal" : "comma-decimal";
  const separator = lastDot >= 0 ? "." : lastComma >= 0 ? "," : null;
  if (separator === null) return null;
  const asDecimal: NumberFormat = separator === "." ? "dot-decimal" : "comma-decimal";
  const asGrouping: NumberFormat = separator === "." ? "comma-decimal" : "dot-decimal";
  if (body.split(separator).length > 2) return asGrouping;
  const after = body.length - body.indexOf(separator) - 1;
  return after === 3 ? null : asDecimal;
}

/**
 * A spreadsheet number as a plain decimal string, rounded as Excel displays it: Excel keeps
 * 15 significant digits (Microsoft, "Excel specifications and limits": number precision 15 digits),
 * so a stored 0.30000000000000004 reads "0.3". Never exponent notation.
 * @example numberToPlainDecimal(1234.56) // "1234.56"
 */
export function numberToPlainDecimal(n: number): string | null {
  if (!Number.isFinite(n)) return null;
  if (n === 0) return "0";
  // JavaScript's shortest round-trip text, when it has no exponent and at most 15 significant
  // digits, is already the 15-digit rounding written plainly (the usual case: money).
  const shortest = String(n);
  if (!shortest.includes("e") && significantDigits(shortest) <= 15) return shortest;
  const [mantissa, exponentText] = Math.abs(n).toPrecision(15).split("e");
  const exponent = exponentText === undefined ? 0 : Number(exponentText);
  const point = (mantissa.includes(".") ? mantissa.indexOf(".") : mantissa.length) + exponent;
  const digits = mantissa.replace(".", "");
  let text: string;
  if (point <= 0) text = `0.${"0".repeat(-point)}${digits}`;
  else if (point >= digits.length) text = digits + "0".repeat(point - digits.length);
  else text = `${digits.slice(0, point)}.${digits.slice(point)}`;
  if (text.includes(".")) text = text.replace(/0+$/, "").replace(/\.$/, "");
  text = text.replace(/^0+(?=\d)/, "");
  return n < 0 ? `-${text}` : text;
}

function significantDigits(plain: string): number {
  let digits = 0;
  let leading = true;
  for (let i = 0; i < plain.length; i += 1) {
    const code = plain.charCodeAt(i);
    if (code < 48 || code > 57) continue; // sign, point
    if (leading && code === 48) continue;
    leading = false;
    digits += 1;
  }
  return digits;
}
