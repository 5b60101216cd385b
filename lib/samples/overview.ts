import "server-only";
import type { Knex } from "knex";
import type { SampleRecord } from "@/lib/data/samples";
import { evaluationFor } from "./context";

/** A sample as the engagement page lists it: distinct items drawn, progress, and the computed result so far. */
export interface SampleOverview {
  sampleId: number;
  /** Distinct items in the current draw (a monetary-unit draw hits a large item more than once); null before the draw. */
  items: number | null;
  withResult: number;
  projectedMisstatement: number | null;
  upperBound: number | null;
  supported: boolean | null;
  complete: boolean;
  attribute: boolean;
  deviations: number;
}

export async function listSampleOverviews(db: Knex, { engagementId, samples }: { engagementId: number; samples: SampleRecord[] }): Promise<Record<number, SampleOverview>> {
  const entries = await Promise.all(samples.map(async (s): Promise<[number, SampleOverview]> => {
    const blank = { sampleId: s.id, items: null, withResult: 0, projectedMisstatement: null, upperBound: null, supported: null, complete: false, attribute: s.method === "attribute", deviations: 0 };
    if (s.status !== "drawn") return [s.id, blank];
    const e = await evaluationFor(db, { engagementId, sampleId: s.id });
    return [s.id, {
      ...blank, items: e.progress.total, withResult: e.progress.done + e.progress.notAuditable,
      projectedMisstatement: e.projectedMisstatement, upperBound: e.upperBound, supported: e.supported, complete: e.complete, deviations: e.progress.deviations,
    }];
  }));
  return Object.fromEntries(entries);
}
