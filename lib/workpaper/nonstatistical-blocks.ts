import "server-only";
import type { SampleRecord } from "@/lib/data/samples";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import type { SamplePlan } from "@/lib/samples/plan";
import { methodologyOfSample } from "@/lib/samples/methodology";
import type { AnomalyRow, KeyItemsBlock } from "@/templates/workpaper/workpaper-data";

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
