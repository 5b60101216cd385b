/**
 * The evaluation's sentences, built with the figures they quote, so that every printout says the
 * same words (the page, the API and the PDF print them as they are).
 */
import { decimalToCents } from "@/lib/money";
import type { ClassicalDecisionFigures, Money } from "./evaluation-types";

const MINUS = "\u2212";

/** "1234567.8" → "1,234,567.80" (exact, on the decimal text; the same rule as the page and the PDF). */
export function moneyWords(value: Money): string {
  const negative = value.startsWith("-") && decimalToCents(value) !== 0n;
  const [whole, frac = "00"] = value.replace(/^-/, "").split(".");
  return `${negative ? MINUS : ""}${whole.replace(/\B(?=(\d{3})+(?!\d))/g, ",")}.${frac.padEnd(2, "0").slice(0, 2)}`;
}

export const MUS_UNDERSTATEMENT_CAUTION =
  "Understatement tested by monetary-unit sampling: an item is selected in proportion to its recorded amount, so understated items are less likely to be selected than their true amounts warrant, omitted items and zero balances cannot be selected at all, and negative balances are outside the frame. Consider a test from a complete independent source (e.g. subsequent receipts or payments) for understatement.";

export const UNAUDITABLE_TREATMENT: Record<"overstatement" | "understatement" | "both" | "attribute", string> = {
  overstatement:
    "An item that could not be audited counts as fully misstated in the direction tested: audited value 0, a 100% overstatement.",
  understatement:
    "An item that could not be audited counts as fully misstated in the direction tested: an understatement equal to its book value (audited value twice the book value), never as audited 0.",
  both: "An item that could not be audited counts as fully misstated: audited value 0, a 100% overstatement (the direction that affects the bound tested most for a recorded balance); consider its understatement risk separately.",
  attribute: "An item that could not be audited counts as a deviation.",
};

/** The same treatment in a few words, said on the row of each item marked "could not be audited" (the grid, at once). */
export const UNAUDITABLE_ON_ROW: Record<keyof typeof UNAUDITABLE_TREATMENT, string> = {
  overstatement: "Evaluated as audited 0: misstated by its whole book value (100% overstatement).",
  understatement: "Evaluated as audited at twice its book value: an understatement equal to its book value.",
  both: "Evaluated as audited 0: misstated by its whole book value (100% overstatement); weigh its understatement risk apart.",
  attribute: "Evaluated as a deviation.",
};

const rate = (v: number) => `${(v * 100).toFixed(v * 1000 === Math.round(v * 1000) ? 1 : 2).replace(/\.0$/, "")}%`;

/** The classical decision rule in words, with the figures substituted. */
export function describeClassicalRule(
  d: Omit<ClassicalDecisionFigures, "rule"> & {
    estimatedAuditedValue: Money;
    standardError: Money;
    bookValue: Money;
    tolerableMisstatement: Money;
  },
): string {
  const coef = d.distribution === "t" ? `t_α (Student, ${d.degreesOfFreedom?.toFixed(1)} df)` : "z_α";
  const sides = d.coefficientSides === "two" ? `two-sided, at 1 − α/2` : `one-sided, at 1 − α`;
  const a = `A′ = ${coef} · SE = ${d.coefficient.toFixed(4)} × ${moneyWords(d.standardError)} = ${moneyWords(d.achievedAllowance)} (α = ${rate(d.riskOfIncorrectRejection)} risk of incorrect rejection, ${sides})`;
  const cmp =
    d.adjustedAllowance === null
      ? `A′ ≤ A (planned ${moneyWords(d.plannedAllowance)}), so the interval is Ŷ ± A′`
      : `A′ > A (planned ${moneyWords(d.plannedAllowance)}), so the interval uses the adjusted allowance A″ = A′ + TM · (1 − A′/A) = ${moneyWords(d.adjustedAllowance)}, which keeps the risk of incorrect acceptance at ${rate(d.riskOfIncorrectAcceptance)}`;
  const limits = [
    d.lowerLimit === null ? null : `lower limit ${moneyWords(d.lowerLimit)}`,
    d.upperLimit === null ? null : `upper limit ${moneyWords(d.upperLimit)}`,
  ]
    .filter(Boolean)
    .join(", ");
  const tested = d.direction === "both" ? "both directions" : `${d.direction} only`;
  const verdict = d.supported
    ? `The recorded amount ${moneyWords(d.bookValue)} lies within the interval on the side${d.direction === "both" ? "s" : ""} tested (${tested}).`
    : `The recorded amount ${moneyWords(d.bookValue)} lies ${moneyWords(d.beyondLimit)} ${d.beyond === "upper" ? "above the upper" : "below the lower"} limit (${tested}): an adjustment of at least that amount is the one to consider.`;
  return `${a}; ${cmp}: Ŷ = ${moneyWords(d.estimatedAuditedValue)}, ${limits}. ${verdict}`;
}

/** The MUS comparison with TM in words, naming the gross/net convention. */
export function describeMusLimits(o: {
  compared: { overstatement: Money | null; understatement: Money | null };
  limits: "gross" | "net";
  tolerable: Money;
  supported: boolean;
}): string {
  const convention =
    o.limits === "gross"
      ? "gross upper limits (each direction as it stands; the firm's convention)"
      : "net upper limits (less the other direction's projected misstatement; the firm's convention)";
  const parts = (["overstatement", "understatement"] as const).flatMap((d) => {
    const v = o.compared[d];
    if (v === null) return [];
    const c = decimalToCents(v) - decimalToCents(o.tolerable);
    return [`${d} ${moneyWords(v)} ${c <= 0n ? (c === 0n ? "equal to" : "below") : "above"} TM`];
  });
  return `Compared with tolerable misstatement ${moneyWords(o.tolerable)} on ${convention}: ${parts.join("; ")}.`;
}
