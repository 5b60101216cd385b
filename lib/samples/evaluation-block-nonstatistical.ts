/**
 * The nonstatistical evaluation block of the evaluation view model (printed as it is by the sample
 * page, `GET …/evaluation` and the PDF workpaper). Pure: the engine projects, this module words it.
 */
import { centsToDecimal, decimalToCents } from "@/lib/money";
import { projectMisstatement, type ProjectionMethod, type TestDirection } from "@/lib/sampling";
import type { Money, NonstatisticalEvaluationBlock } from "./evaluation-types";
import { moneyWords } from "./evaluation-words";
import { countOf } from "@/lib/format/number";

export interface NonstatisticalItem {
  bookValue: Money;
  auditedValue: Money;
  /** An accepted anomaly: out of the projection, added at actual. */ anomaly?: boolean;
}

export const NONSTATISTICAL_RESPONSES = [
  "Extend the test: examine more items from the remainder and evaluate again.",
  "Perform alternative or additional substantive procedures on the balance.",
  "Ask the client to investigate the misstatements found and adjust the recorded amount.",
  "Reconsider the assessed risks and the nature, timing and extent of further procedures.",
];

export const NONSTATISTICAL_REFERENCES = [
  "PCAOB AS 2315.26: project the misstatement found in the sample to the items from which it was selected, add the misstatement of items examined 100 percent, and compare the total with tolerable misstatement, considering sampling risk; when the total is close to tolerable misstatement, the risk that actual misstatement exceeds it may be unacceptably high.",
  "AICPA Audit Guide “Audit Sampling”, nonstatistical sampling: ratio projection (misstatement ÷ sampled book value × remainder book value) or difference projection (misstatement per item × items in the remainder); the total compared with tolerable and with the expected misstatement used in planning.",
  "ISA 530 ¶13 / AU-C 530.13: an anomalous misstatement, once the auditor has a high degree of certainty it is not representative, is excluded from the projection and considered at its actual amount.",
];

export const NO_BOUND_NOTE =
  "A nonstatistical sample has no statistical bound: sampling risk is judged, not measured (AS 2315.26; AU-C 530; ISA 530).";
export const HAPHAZARD_NOTE =
  "The items outside the key items were selected haphazardly: the selection cannot be re-performed from a seed, and its representativeness rests on the auditor's avoidance of conscious bias (ISA 530, Appendix 4).";

const cents = (m: Money) => decimalToCents(m);
const units = (m: Money) => Number(cents(m)) / 100;
const fromUnits = (v: number) => centsToDecimal(BigInt(Math.round(v * 100)));
const abs = (c: bigint) => (c < 0n ? -c : c);

/**
 * Projects the misstatement of a nonstatistical sample and states where it stands.
 * `sample`: items outside the key items with a result; `keyItems`: key items with a result.
 */
export function buildNonstatisticalEvaluation(o: {
  projection: ProjectionMethod;
  direction: TestDirection;
  sample: NonstatisticalItem[];
  keyItems: NonstatisticalItem[];
  keyItemsPlanned: number;
  remainder: { count: number; bookValue: Money };
  tolerableMisstatement: Money;
  expectedMisstatement: Money;
  wellBelow: { basis: "expected-misstatement" | "share-of-tolerable"; share: number; amount: Money };
  haphazard: boolean;
}): NonstatisticalEvaluationBlock {
  const anomalies = o.sample.filter((i) => i.anomaly);
  const anomalyCents = anomalies.reduce((s, i) => s + cents(i.bookValue) - cents(i.auditedValue), 0n);
  // An accepted anomaly stays in the sample, unmisstated, for the projection, and is added at its actual amount.
  const forProjection = o.sample.map((i) => ({
    bookValue: units(i.bookValue),
    auditedValue: units(i.anomaly ? i.bookValue : i.auditedValue),
  }));
  const keyItems = o.keyItems.map((i) => ({ bookValue: units(i.bookValue), auditedValue: units(i.auditedValue) }));
  const keyCents = o.keyItems.reduce((s, i) => s + cents(i.bookValue) - cents(i.auditedValue), 0n);
  const p =
    forProjection.length > 0
      ? projectMisstatement({
          method: o.projection,
          sample: forProjection,
          remainderBookValue: units(o.remainder.bookValue),
          remainderItemCount: o.remainder.count,
          keyItems,
        })
      : null;
  const projectedCents = p ? cents(fromUnits(p.projectedMisstatement)) : 0n;
  const totalCents = projectedCents + keyCents + anomalyCents;
  const comparedCents =
    o.direction === "understatement" ? -totalCents : o.direction === "both" ? abs(totalCents) : totalCents;
  const tm = cents(o.tolerableMisstatement);
  const wellBelow = cents(o.wellBelow.amount);
  const verdict = comparedCents >= tm ? "exceeds" : comparedCents <= wellBelow ? "supports" : "approaches";
  const wellBelowBasis =
    o.wellBelow.basis === "expected-misstatement"
      ? `the expected misstatement used in planning, ${moneyWords(o.wellBelow.amount)}`
      : `${Math.round(o.wellBelow.share * 100)}% of tolerable misstatement, ${moneyWords(o.wellBelow.amount)}`;
  const sampleMisCents = o.sample.reduce((s, i) => s + cents(i.bookValue) - cents(i.auditedValue), 0n);
  const parts = `projection ${moneyWords(centsToDecimal(projectedCents))} by the ${o.projection} method + key items ${moneyWords(centsToDecimal(keyCents))}${anomalies.length ? ` + anomalous misstatements ${moneyWords(centsToDecimal(anomalyCents))}` : ""}`;
  const compared = moneyWords(centsToDecimal(comparedCents));
  const tmWords = moneyWords(o.tolerableMisstatement);
  const statement =
    verdict === "supports"
      ? `The total projected misstatement of ${compared} (${parts}) is well below tolerable misstatement ${tmWords} — at or below ${wellBelowBasis} — so the sample supports the recorded amount.`
      : verdict === "approaches"
        ? `The total projected misstatement of ${compared} (${parts}) is below tolerable misstatement ${tmWords} but not well below it — it exceeds ${wellBelowBasis} — so the risk that actual misstatement exceeds tolerable misstatement is unacceptably high unless further work reduces it.`
        : `The total projected misstatement of ${compared} (${parts}) reaches or exceeds tolerable misstatement ${tmWords}: the sampling risk is unacceptably high and the sample does not support the recorded amount.`;
  const warnings = [NO_BOUND_NOTE];
  if (o.haphazard) warnings.push(HAPHAZARD_NOTE);
  if (o.keyItems.length < o.keyItemsPlanned)
    warnings.push(
      `${countOf(o.keyItemsPlanned - o.keyItems.length, "key item")} ${o.keyItemsPlanned - o.keyItems.length === 1 ? "has" : "have"} no result yet; key items are examined in full.`,
    );
  return {
    method: "nonstatistical",
    projection: o.projection,
    direction: o.direction,
    sampleCount: o.sample.length,
    sampleBookValue: centsToDecimal(o.sample.reduce((s, i) => s + cents(i.bookValue), 0n)),
    sampleMisstatement: centsToDecimal(sampleMisCents),
    remainderCount: o.remainder.count,
    remainderBookValue: o.remainder.bookValue,
    projectedMisstatement: centsToDecimal(projectedCents),
    keyItems: { planned: o.keyItemsPlanned, evaluated: o.keyItems.length, misstatement: centsToDecimal(keyCents) },
    anomalies: { count: anomalies.length, misstatement: centsToDecimal(anomalyCents) },
    totalProjected: centsToDecimal(totalCents),
    comparedAmount: centsToDecimal(comparedCents),
    tolerableMisstatement: o.tolerableMisstatement,
    expectedMisstatement: o.expectedMisstatement,
    wellBelowAmount: o.wellBelow.amount,
    wellBelowBasis,
    verdict,
    supported: verdict === "supports",
    statement,
    responses: verdict === "supports" ? [] : NONSTATISTICAL_RESPONSES,
    warnings,
    formulaReferences: NONSTATISTICAL_REFERENCES,
  };
}
