import "server-only";
import { EngineInputError, nonstatisticalSampleSize } from "@/lib/sampling";
import { centsToDecimal } from "@/lib/money";
import type { MethodologySettings } from "@/lib/validation/methodology";
import type { SampleParams } from "@/lib/validation/sample";
import type { Frame } from "./population-frame";
import type { KeyItemsPlan } from "./key-items";
import type { RiskSizing } from "./risk-sizing";
import { countOf, formatCount } from "@/lib/format/number";

/** What a nonstatistical plan fixes for its selection and evaluation (printed in the workpaper). */
export interface NonstatisticalPlanPart {
  selection: "random" | "systematic" | "haphazard";
  projection: "ratio" | "difference";
  assuranceFactor: number;
  expectedMisstatement: string;
  expectedMisstatementAdjustment: MethodologySettings["nonstatistical"]["expectedMisstatementAdjustment"];
  minimumSampleSize: number;
  raisedToMinimum: boolean;
  /** When the total projection counts as well below TM (firm setting, stamped here). */
  wellBelow: { basis: MethodologySettings["nonstatistical"]["wellBelowBasis"]; share: number; amount: string };
}

const SELECTION_NOTES = {
  random: "Random selection on the remainder (seeded, re-performable).",
  systematic: "Systematic selection with a random start on the remainder (seeded, re-performable).",
  haphazard:
    "Haphazard selection: the auditor picks the items on the population's item grid, avoiding conscious bias; each pick is recorded with who and when. A haphazard selection cannot be re-performed from a seed.",
} as const;

/**
 * Sizes a nonstatistical plan: n = ⌈(BV − key items' BV) ÷ TM × assurance factor⌉ with the firm's
 * expected-misstatement adjustment and minimum (AICPA Audit Guide "Audit Sampling", nonstatistical chapter).
 */
export function planNonstatistical(
  frame: Frame,
  p: SampleParams,
  a: {
    tolerable: number;
    expected: number;
    risk: RiskSizing;
    keyItems: KeyItemsPlan | null;
    settings: MethodologySettings["nonstatistical"];
  },
) {
  const keyTotal = Number(a.keyItems?.total ?? "0");
  const bookValue = Number(centsToDecimal(frame.totalCents));
  if (!(bookValue > 0))
    throw new EngineInputError(
      "bookValue",
      "bookValue: the population's book value must be above zero for a nonstatistical size",
    );
  const r = nonstatisticalSampleSize({
    bookValue,
    keyItemsBookValue: keyTotal,
    tolerableMisstatement: a.tolerable,
    assuranceFactor: a.risk.factor,
    expectedMisstatement: a.expected,
    expectedMisstatementAdjustment: a.settings.expectedMisstatementAdjustment,
    minimumSampleSize: a.settings.minimumSampleSize,
  });
  const remainderCount = a.keyItems?.remainder.count ?? frame.bookValues.length;
  const computedSize = Math.min(r.sampleSize, remainderCount);
  const selection = p.selection as NonstatisticalPlanPart["selection"];
  const wellBelowAmount =
    a.settings.wellBelowBasis === "expected-misstatement" ? a.expected : a.settings.wellBelowShare * a.tolerable;
  const part: NonstatisticalPlanPart = {
    selection,
    projection: p.projection!,
    assuranceFactor: a.risk.factor,
    expectedMisstatement: a.expected.toFixed(2),
    expectedMisstatementAdjustment: a.settings.expectedMisstatementAdjustment,
    minimumSampleSize: a.settings.minimumSampleSize,
    raisedToMinimum: r.raisedToMinimum,
    wellBelow: {
      basis: a.settings.wellBelowBasis,
      share: a.settings.wellBelowShare,
      amount: wellBelowAmount.toFixed(2),
    },
  };
  const tmLabel = a.settings.expectedMisstatementAdjustment === "subtract-from-tolerable" ? "(TM − EM)" : "TM";
  const warnings = [...r.warnings, SELECTION_NOTES[selection]];
  if (r.raisedToMinimum)
    warnings.push(`The firm's minimum of ${countOf(a.settings.minimumSampleSize, "item")} raised the computed size.`);
  if (r.sampleSize > remainderCount)
    warnings.push(
      `The formula asks for ${countOf(r.sampleSize, "item")} but only ${formatCount(remainderCount)} ${remainderCount === 1 ? "remains" : "remain"} outside the key items: examine them all.`,
    );
  return {
    computedSize,
    formula: `n = ⌈(BV − key items' BV) ÷ ${tmLabel} × assurance factor⌉ (AICPA Audit Guide “Audit Sampling”, nonstatistical sampling)${a.settings.minimumSampleSize > 0 ? `, at least ${a.settings.minimumSampleSize} (firm minimum)` : ""}`,
    inputs: {
      BV: centsToDecimal(frame.totalCents),
      "key items' BV": keyTotal.toFixed(2),
      TM: a.tolerable.toFixed(2),
      EM: a.expected.toFixed(2),
      "assurance factor": a.risk.factor,
      "n (exact)": Number(r.exactSize.toFixed(4)),
    } as Record<string, string | number>,
    nonstatistical: part,
    warnings,
  };
}
