import "server-only";
import { notFound } from "next/navigation";
import { getDb } from "@/db/knex";
import { AppError } from "@/lib/errors";
import { loadSampleWithEvaluation } from "@/lib/samples/context";

/** The sample view and its evaluation for a page; not-found for a sample that is not on this engagement. */
export async function loadSamplePage(engagementId: number, sampleIdParam: string) {
  const sampleId = Number(sampleIdParam);
  if (!Number.isSafeInteger(sampleId) || sampleId <= 0) notFound();
  try {
    return await loadSampleWithEvaluation(getDb(), { engagementId, sampleId });
  } catch (err) {
    if (err instanceof AppError && err.status === 404) notFound();
    throw err;
  }
}
