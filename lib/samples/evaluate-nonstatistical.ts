import "server-only";
import { projectMisstatement, type SampledItem } from "@/lib/sampling";
import type { SampleRecord } from "@/lib/data/samples";
import type { SampleItemRecord } from "@/lib/data/sample-items";

export type NonstatisticalVerdict = "supports" | "approaches" | "exceeds";

/** The nonstatistical evaluation as the page, the API and the workpaper print it. */
export interface NonstatisticalEvaluation {
  kind: "nonstatistical";
  projection: "ratio" | "difference";
  sample: { count: number; bookValue: number; misstatement: number; rate: number };
  remainder: { count: number; bookValue: number };
  /** The sample's misstatement projected to the remainder (anomalies excluded). */
  projectedMisstatement: number;
  keyItems: { count: number; evaluated: number; misstatement: number };
  anomalies: { count: number; misstatement: number };
  /** Projection + key items + anomalies, in the tested direction's sign convention (overstatement positive). */
  totalProjected: number;
  /** What is compared with TM: the total in the direction tested. */
  comparedAmount: number;
  tolerableMisstatement: number;
  expectedMisstatement: number;
  wellBelowAmount: number;
  wellBelowBasis: string;
  verdict: NonstatisticalVerdict;
  responses: string[];
}

export const NONSTATISTICAL_RESPONSES = [
  "Extend the test: examine more items from the remainder and evaluate again.",
  "Perform alternative or additional substantive procedures on the balance.",
  "Ask the client to investigate the misstatements found and adjust the recorded amount.",
  "Reconsider the assessed risks and the nature, timing and extent of further procedures.",
];

const NO_BOUND =
  "A nonstatistical sample has no statistical bound: sampling risk is judged, not measured (AS 2315.26; AU-C 530; ISA 530).";
const fmt = (v: number) => v.toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 });
const toSampled = (it: SampleItemRecord): SampledItem => ({
  bookValue: Number(it.bookValue),
  auditedValue: it.status === "not-auditable" ? 0 : Number(it.auditedValue),
});
const misstatementOf = (it: SampleItemRecord) => Number(it.bookValue) - toSampled(it).auditedValue;

/** An anomaly counts only once a manager or partner has accepted it, and only where the firm allows anomalies. */
export const acceptedAnomaly = (it: SampleItemRecord, allowed: boolean) => allowed && Boolean(it.anomaly?.acceptedAt);

/**
 * Evaluates a nonstatistical sample (PCAOB AS 2315.26; AICPA Audit Guide "Audit Sampling",
 * nonstatistical evaluation): the sample's misstatement projected to the remainder by the planned
 * method, plus the key items' and accepted anomalies' actual misstatement, compared with TM and with
 * the "well below" amount the firm set (default: the expected misstatement used in planning).
 */
export function evaluateNonstatistical(
  sample: SampleRecord,
  done: SampleItemRecord[],
  tolerable: number,
  anomaliesAllowed: boolean,
) {
  const ns = sample.plan.nonstatistical!;
  const keyDone = done.filter((i) => i.keyItem);
  const sampled = done.filter((i) => !i.keyItem);
  const anomalies = sampled.filter((i) => acceptedAnomaly(i, anomaliesAllowed));
  const remainder = {
    count: sample.plan.keyItems?.remainder.count ?? sample.plan.frameSize,
    bookValue: Number(sample.plan.keyItems?.remainder.total ?? sample.plan.frameTotal),
  };
  // An accepted anomaly stays in the sample at zero misstatement for the projection and is added at its actual amount.
  const forProjection = sampled.map((i) =>
    acceptedAnomaly(i, anomaliesAllowed)
      ? { bookValue: Number(i.bookValue), auditedValue: Number(i.bookValue) }
      : toSampled(i),
  );
  const cents = (v: number) => Math.round(v * 100);
  const anomalyMisstatement = anomalies.reduce((s, i) => s + cents(misstatementOf(i)), 0) / 100;
  const p =
    forProjection.length > 0
      ? projectMisstatement({
          method: ns.projection,
          sample: forProjection,
          remainderBookValue: remainder.bookValue,
          remainderItemCount: remainder.count,
          keyItems: keyDone.map(toSampled),
        })
      : {
          projectedMisstatement: 0,
          keyItemsMisstatement: keyDone.reduce((s, i) => s + cents(misstatementOf(i)), 0) / 100,
          total: 0,
          sampleMisstatement: 0,
          sampleBookValue: 0,
          rate: 0,
        };
  const total = (cents(p.projectedMisstatement) + cents(p.keyItemsMisstatement) + cents(anomalyMisstatement)) / 100;
  const compared =
    sample.direction === "understatement" ? -total : sample.direction === "both" ? Math.abs(total) : total;
  const wellBelow = Number(ns.wellBelow.amount);
  const verdict: NonstatisticalVerdict =
    compared >= tolerable ? "exceeds" : compared <= wellBelow ? "supports" : "approaches";
  const wellBelowBasis =
    ns.wellBelow.basis === "expected-misstatement"
      ? `the expected misstatement used in planning, ${fmt(wellBelow)}`
      : `${Math.round(ns.wellBelow.share * 100)}% of tolerable misstatement, ${fmt(wellBelow)}`;
  const evaluation: NonstatisticalEvaluation = {
    kind: "nonstatistical",
    projection: ns.projection,
    sample: {
      count: sampled.length,
      bookValue: p.sampleBookValue,
      misstatement: (cents(p.sampleMisstatement) + cents(anomalyMisstatement)) / 100,
      rate: p.rate,
    },
    remainder,
    projectedMisstatement: p.projectedMisstatement,
    keyItems: {
      count: sample.plan.keyItems?.count ?? 0,
      evaluated: keyDone.length,
      misstatement: p.keyItemsMisstatement,
    },
    anomalies: { count: anomalies.length, misstatement: anomalyMisstatement },
    totalProjected: total,
    comparedAmount: compared,
    tolerableMisstatement: tolerable,
    expectedMisstatement: Number(ns.expectedMisstatement),
    wellBelowAmount: wellBelow,
    wellBelowBasis,
    verdict,
    responses: verdict === "supports" ? [] : NONSTATISTICAL_RESPONSES,
  };
  const parts = `projection ${fmt(p.projectedMisstatement)} by the ${ns.projection} method + key items ${fmt(p.keyItemsMisstatement)}${anomalies.length ? ` + anomalous misstatements ${fmt(anomalyMisstatement)}` : ""}`;
  const conclusion =
    verdict === "supports"
      ? `The total projected misstatement of ${fmt(compared)} (${parts}) is well below tolerable misstatement ${fmt(tolerable)} — at or below ${wellBelowBasis} — so the sample supports the recorded amount. Carry ${fmt(total)} to the summary of misstatements.`
      : verdict === "approaches"
        ? `The total projected misstatement of ${fmt(compared)} (${parts}) is below tolerable misstatement ${fmt(tolerable)} but not well below it — it exceeds ${wellBelowBasis} — so the risk that the actual misstatement exceeds tolerable misstatement may be unacceptably high. Weigh the misstatements' nature and cause, consider the responses listed, and carry ${fmt(total)} to the summary of misstatements.`
        : `The total projected misstatement of ${fmt(compared)} (${parts}) reaches or exceeds tolerable misstatement ${fmt(tolerable)}: the sampling risk is unacceptably high and the sample does not support the recorded amount. Respond as listed, and carry ${fmt(total)} to the summary of misstatements.`;
  const warnings = [NO_BOUND];
  if (ns.selection === "haphazard")
    warnings.push(
      "The items outside the key items were selected haphazardly: the selection cannot be re-performed from a seed, and its representativeness rests on the auditor's avoidance of bias (ISA 530, Appendix 4(d)).",
    );
  if (keyDone.length < (sample.plan.keyItems?.count ?? 0))
    warnings.push(
      `${(sample.plan.keyItems?.count ?? 0) - keyDone.length} key items have no result yet; key items are examined in full.`,
    );
  return {
    evaluation,
    projectedMisstatement: total,
    upperBound: null,
    supported: verdict === "supports" ? true : verdict === "exceeds" ? false : null,
    conclusion,
    warnings,
  };
}
