import "server-only";
import type { Knex } from "knex";
import type { SampleRecord } from "@/lib/data/samples";
import { evaluationFor } from "./context";
import type { EvaluationBlock, Money } from "./evaluation-types";

/** The figure a reader compares with tolerable misstatement, per method (none for attributes: the deviations are shown). */
function boundOf(block: EvaluationBlock | null): SampleOverview["bound"] {
  if (!block || block.method === "attributes") return null;
  if (block.method === "mus") {
    const limits = [block.compared.overstatement, block.compared.understatement].filter((v): v is Money => v !== null);
    const largest = limits.reduce<Money | null>((a, v) => (a === null || Number(v) > Number(a) ? v : a), null);
    return largest === null ? null : { label: "upper limit", amount: largest };
  }
  // A nonstatistical sample claims no bound: the list shows its total projected misstatement only.
  if (block.method === "nonstatistical") return null;
  return { label: "allowance", amount: block.decision.allowance };
}

/** A sample as the engagement page lists it: distinct items drawn, progress, and the computed result so far. */
export interface SampleOverview {
  sampleId: number;
  /** Distinct items in the current draw (a monetary-unit draw hits a large item more than once); null before the draw. */
  items: number | null;
  withResult: number;
  projectedMisstatement: Money | null;
  /** The method's bound in words and amount: the upper misstatement limit compared with TM, or the classical allowance. */
  bound: { label: string; amount: Money } | null;
  supported: boolean | null;
  complete: boolean;
  attribute: boolean;
  deviations: number;
}

export async function listSampleOverviews(
  db: Knex,
  { engagementId, samples }: { engagementId: number; samples: SampleRecord[] },
): Promise<Record<number, SampleOverview>> {
  const entries = await Promise.all(
    samples.map(async (s): Promise<[number, SampleOverview]> => {
      const blank = {
        sampleId: s.id,
        items: null,
        withResult: 0,
        projectedMisstatement: null,
        bound: null,
        supported: null,
        complete: false,
        attribute: s.method === "attribute",
        deviations: 0,
      };
      if (s.status !== "drawn") return [s.id, blank];
      const e = await evaluationFor(db, { engagementId, sampleId: s.id });
      return [
        s.id,
        {
          ...blank,
          items: e.progress.total,
          withResult: e.progress.done + e.progress.notAuditable,
          projectedMisstatement: e.projectedMisstatement,
          bound: boundOf(e.block),
          supported: e.computed.supported,
          complete: e.complete,
          deviations: e.progress.deviations,
        },
      ];
    }),
  );
  return Object.fromEntries(entries);
}
