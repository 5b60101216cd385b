import "server-only";
import { centsToDecimal } from "@/lib/money";
import type { SheetCell } from "./workbook-read";

/** A cell read as one kind of value, or the reason it cannot be. */
export type Read<T> = { ok: true; value: T } | { ok: false; reason: string };
const ok = <T>(value: T): Read<T> => ({ ok: true, value });
const fail = <T>(reason: string): Read<T> => ({ ok: false, reason });

const FORMULA_REASON = "The cell holds a formula; type the value itself (formulas are not imported).";
const quote = (s: string) => (s.length > 40 ? `"${s.slice(0, 40)}…"` : `"${s}"`);
const AMOUNT_TEXT = /^-?\d{1,16}(\.\d{1,2})?$/;

/** An amount in exact cents as a decimal string ("1250.00"); numbers with more than 2 decimals are refused, not rounded. */
export function readAmount(cell: SheetCell): Read<string | null> {
  switch (cell.kind) {
    case "empty":
      return ok(null);
    case "number": {
      const cents = Math.round(cell.value * 100);
      if (!Number.isFinite(cell.value) || Math.abs(cell.value * 100 - cents) > 1e-6 * Math.max(1, Math.abs(cents)))
        return fail(`${cell.value} has more than 2 decimals.`);
      if (!Number.isSafeInteger(cents)) return fail(`${cell.value} is too large.`);
      return ok(centsToDecimal(BigInt(cents)));
    }
    case "text": {
      const text = cell.value.trim().replace(/[\s,]/g, "");
      const negative = /^\(.*\)$/.test(text);
      const digits = negative ? `-${text.slice(1, -1)}` : text;
      if (!AMOUNT_TEXT.test(digits))
        return fail(`Text in an amount cell: ${quote(cell.value)} is not an amount (enter a number such as 1250.00).`);
      return ok(digits.includes(".") ? digits.replace(/\.(\d)$/, (_m, d: string) => `.${d}0`) : `${digits}.00`);
    }
    case "formula":
      return fail(FORMULA_REASON);
    case "date":
      return fail("A date in an amount cell; enter the amount.");
    case "boolean":
      return fail("TRUE/FALSE in an amount cell; enter the amount.");
    case "error":
      return fail(`The cell shows the error ${cell.value}; enter the amount.`);
  }
}

/** Free text; a formula-looking text stays text. Empty text is null. */
export function readText(cell: SheetCell, maxLength: number): Read<string | null> {
  switch (cell.kind) {
    case "empty":
      return ok(null);
    case "text": {
      const text = cell.value.trim();
      if (text.length > maxLength) return fail(`The text is ${text.length} characters; at most ${maxLength}.`);
      return ok(text === "" ? null : text);
    }
    case "number":
      return ok(String(cell.value));
    case "boolean":
      return ok(cell.value ? "TRUE" : "FALSE");
    case "date":
      return ok(cell.value.toISOString().slice(0, 10));
    case "formula":
      return fail(FORMULA_REASON);
    case "error":
      return fail(`The cell shows the error ${cell.value}.`);
  }
}

/** A choice from a list, as its label or code; `from` maps the typed text to the code. */
export function readChoice<T>(
  cell: SheetCell,
  from: (text: string) => T | undefined,
  allowed: string[],
): Read<T | null> {
  const text = readText(cell, 200);
  if (!text.ok || text.value === null) return text as Read<null>;
  const value = from(text.value);
  return value === undefined ? fail(`${quote(text.value)} is not in the list (${allowed.join(", ")}).`) : ok(value);
}

const YES = new Set(["yes", "y", "true", "1"]);
const NO = new Set(["no", "n", "false", "0"]);

export function readYesNo(cell: SheetCell): Read<boolean | null> {
  if (cell.kind === "boolean") return ok(cell.value);
  return readChoice(cell, (t) => (YES.has(t.toLowerCase()) ? true : NO.has(t.toLowerCase()) ? false : undefined), [
    "Yes",
    "No",
  ]);
}

/** A whole number from a hidden column (item id, version). */
export function readWhole(cell: SheetCell): number | null {
  const n = cell.kind === "number" ? cell.value : cell.kind === "text" ? Number(cell.value.trim()) : NaN;
  return Number.isSafeInteger(n) && n > 0 ? n : null;
}

export function readRef(cell: SheetCell): string | null {
  if (cell.kind === "text") return cell.value.trim() || null;
  if (cell.kind === "number") return String(cell.value);
  return null;
}
