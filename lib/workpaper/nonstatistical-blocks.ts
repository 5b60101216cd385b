import "server-only";
import type { SampleRecord } from "@/lib/data/samples";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import type { SamplePlan } from "@/lib/samples/plan";
import type { NonstatisticalEvaluation } from "@/lib/samples/evaluate-nonstatistical";
import { methodologyOfSample } from "@/lib/samples/methodology";
import { money } from "@/templates/workpaper/build-evaluation";
import type { AnomalyRow, KeyItemsBlock, NonstatisticalEvaluationBlock } from "@/templates/workpaper/workpaper-data";

/** The plan's key items with each one's recorded misstatement, for the workpaper. */
export function keyItemsBlock(plan: SamplePlan, active: SampleItemRecord[]): KeyItemsBlock | null {
  const k = plan.keyItems;
  if (!k) return null;
  const byRow = new Map(active.filter((i) => i.keyItem).map((i) => [i.populationRowNumber, i]));
  return {
    threshold: k.threshold,
    count: k.count,
    total: k.total,
    remainder: k.remainder,
    items: k.items.map((i) => ({
      reference: i.itemRef,
      rowNumber: i.rowNumber,
      bookValue: i.bookValue,
      basis: i.basis,
      reason: i.reason,
      misstatement: byRow.get(i.rowNumber)?.misstatement ?? null,
    })),
  };
}

/** Every item marked anomalous, with how the evaluation treated it. */
export function anomalyRows(sample: SampleRecord, active: SampleItemRecord[]): AnomalyRow[] {
  const allowed = methodologyOfSample(sample).anomaliesAllowed;
  return active
    .filter((i) => i.anomaly)
    .map((i) => ({
      reference: i.itemRef,
      misstatement: i.misstatement,
      justification: i.anomaly!.justification,
      markedBy: i.anomaly!.markedByName,
      markedAt: i.anomaly!.markedAt,
      acceptedBy: i.anomaly!.acceptedByName,
      acceptedAt: i.anomaly!.acceptedAt,
      treatment:
        sample.method === "mus"
          ? "Ignored: the Stringer bound has no anomaly provision"
          : !allowed
            ? "Ignored: the firm's methodology does not allow anomalies"
            : i.anomaly!.acceptedAt
              ? "Excluded from the projection; added at its actual amount"
              : "Not accepted: projected like any other misstatement",
    }));
}

/** The nonstatistical evaluation as the page shows it (one computation), in the workpaper's money strings. */
export function nonstatisticalBlock(n: NonstatisticalEvaluation, warnings: string[]): NonstatisticalEvaluationBlock {
  return {
    method: "nonstatistical",
    projection: n.projection,
    sampleCount: n.sample.count,
    sampleBookValue: money(n.sample.bookValue),
    sampleMisstatement: money(n.sample.misstatement),
    remainderCount: n.remainder.count,
    remainderBookValue: money(n.remainder.bookValue),
    projectedMisstatement: money(n.projectedMisstatement),
    keyItemsCount: n.keyItems.count,
    keyItemsMisstatement: money(n.keyItems.misstatement),
    anomaliesCount: n.anomalies.count,
    anomaliesMisstatement: money(n.anomalies.misstatement),
    totalProjected: money(n.totalProjected),
    tolerableMisstatement: money(n.tolerableMisstatement),
    expectedMisstatement: money(n.expectedMisstatement),
    wellBelowAmount: money(n.wellBelowAmount),
    wellBelowBasis: n.wellBelowBasis,
    verdict: n.verdict,
    responses: n.responses,
    warnings,
    formulaReferences: [
      "PCAOB AS 2315.26: project the sample's misstatement to the items from which it was selected; add the misstatement of items examined 100 percent.",
      "AICPA Audit Guide “Audit Sampling”, nonstatistical evaluation: ratio and difference projections; compare the total with tolerable and expected misstatement.",
      "ISA 530 ¶13 / AU-C 530.13: an anomalous misstatement, once justified, is excluded from the projection and considered at its actual amount.",
    ],
  };
}
