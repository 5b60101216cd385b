import "server-only";
import type { Knex } from "knex";
import { getAdoptedAdvisorRun, type AdvisorRunRecord } from "@/lib/data/advisor-runs";
import { listSamplesByEngagementId, type SampleRecord } from "@/lib/data/samples";
import { ADVISED_METHODS } from "./methods";

/** What the advisor panel needs: whether it applies, earlier runs, the adopted one, and samples to borrow misstatements from. */
export async function loadAdvisorState(db: Knex, sample: SampleRecord, runs: AdvisorRunRecord[]) {
  const [adopted, samples] = await Promise.all([
    getAdoptedAdvisorRun(db, { sampleId: sample.id }),
    listSamplesByEngagementId(db, { engagementId: sample.engagementId }),
  ]);
  const unavailable = !ADVISED_METHODS.includes(sample.method)
    ? "The advisor compares estimators for simple random, systematic and monetary-unit samples."
    : sample.status !== "planned"
      ? "The sample has been drawn: the advisor's runs are kept as they were."
      : null;
  return {
    canRun: unavailable === null,
    unavailable,
    runs,
    adopted,
    previousSamples: samples
      .filter((s) => s.id !== sample.id && s.status === "drawn")
      .map((s) => ({ id: s.id, name: s.name })),
  };
}
export type AdvisorState = Awaited<ReturnType<typeof loadAdvisorState>>;
