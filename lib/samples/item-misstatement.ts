/**
 * An item's misstatement as the evaluation counts it — the one rule the grid (as the auditor types),
 * the items API, the progress totals, the workbook and the PDF all print. Pure: the browser imports it.
 *
 * Misstatement = book − audited (overstatement positive). An item that could not be audited is fully
 * misstated in the direction tested (the words: `UNAUDITABLE_ON_ROW` in evaluation-words.ts): audited 0
 * when overstatement (or both directions) is tested, so its whole book value; when understatement is
 * tested, audited at book + |book|, an understatement of its whole book value (−|book|).
 */
import { centsToDecimal, decimalToCents } from "@/lib/money";
import type { TestDirection } from "@/lib/sampling";

/** The audited value the evaluation uses for an item that could not be audited. */
export function unauditableAuditedValue(book: string, direction: TestDirection): string {
  if (direction !== "understatement") return "0.00";
  const cents = decimalToCents(book);
  return centsToDecimal(cents + (cents < 0n ? -cents : cents));
}

/** book − audited in exact cents; an unauditable item counts in full in the direction tested; null without a result. */
export function itemMisstatement(
  status: string,
  book: string,
  audited: string | null,
  direction: TestDirection,
): string | null {
  if (status === "not-auditable") audited = unauditableAuditedValue(book, direction);
  else if (status !== "done" || audited === null) return null;
  return centsToDecimal(decimalToCents(book) - decimalToCents(audited));
}
