import "server-only";
import { cache } from "react";
import { notFound } from "next/navigation";
import { getDb } from "@/db/knex";
import { AppError } from "@/lib/errors";
import { loadSampleWithEvaluation } from "@/lib/samples/context";
import { loadAdvisorState } from "@/lib/advisor/state";
import { ADVISED_METHODS } from "@/lib/advisor/methods";
import { listAdvisorRunsBySampleId } from "@/lib/data/advisor-runs";
import { listClientContactsByEngagementId, listMembersByEngagementId } from "@/lib/data/members";
import { getSupersedingPopulation, listPopulationsByEngagementId } from "@/lib/data/populations";
import { listRequestListsBySampleId } from "@/lib/data/request-lists";
import { listNotesBySampleId } from "@/lib/data/review-notes";
import { getSampleById, listSamplesByEngagementId } from "@/lib/data/samples";
import { listSampleAuditTrail, loadChangeContext } from "@/lib/review/audit-trail";
import type { AuditQuery } from "@/lib/validation/review";

/** The id in a page's `[…Id]` segment, or not-found when it is not a positive whole number. */
export function pageIdOrNotFound(param: string): number {
  const id = Number(param);
  if (!Number.isSafeInteger(id) || id <= 0) notFound();
  return id;
}

/** Runs a page's reads, showing not-found for what is not on this engagement (an AppError 404). */
export async function orNotFound<T>(read: () => Promise<T>): Promise<T> {
  try {
    return await read();
  } catch (err) {
    if (err instanceof AppError && err.status === 404) notFound();
    throw err;
  }
}

/** The sample view and its evaluation for a page, read once per request; not-found for a sample that is not on this engagement. */
export const loadSamplePage = cache(async (engagementId: number, sampleIdParam: string) => {
  const sampleId = pageIdOrNotFound(sampleIdParam);
  return orNotFound(() => loadSampleWithEvaluation(getDb(), { engagementId, sampleId }));
});

/** Everything the sample page shows beside the sample: review notes, the advisor, client requests and a superseding population. */
export const loadSampleScreen = cache(async (engagementId: number, sampleIdParam: string) => {
  const page = await loadSamplePage(engagementId, sampleIdParam);
  const { sample, population } = page.view;
  const db = getDb();
  const [notes, advisor, requestLists, replacement] = await Promise.all([
    listNotesBySampleId(db, { sampleId: sample.id }),
    ADVISED_METHODS.includes(sample.method)
      ? listAdvisorRunsBySampleId(db, { sampleId: sample.id }).then((runs) => loadAdvisorState(db, sample, runs))
      : null,
    listRequestListsBySampleId(db, { sampleId: sample.id }),
    population.status === "superseded"
      ? getSupersedingPopulation(db, { engagementId, populationId: population.id })
      : null,
  ]);
  return { ...page, notes, advisor, requestLists, replacement };
});

/** The engagement's populations and samples: what planning a sample or loading a population chooses from. */
export const loadPlanChoices = cache(async (engagementId: number) => {
  const db = getDb();
  const [populations, samples] = await Promise.all([
    listPopulationsByEngagementId(db, { engagementId }),
    listSamplesByEngagementId(db, { engagementId }),
  ]);
  return { populations, samples };
});

/** The change-a-plan page: the sample and what its plan can choose from. */
export async function loadEditPlanPage(engagementId: number, sampleIdParam: string) {
  const [page, choices] = await Promise.all([
    loadSamplePage(engagementId, sampleIdParam),
    loadPlanChoices(engagementId),
  ]);
  return { ...page, ...choices };
}

/** The new-request-list page: the sample and the engagement's client contacts. */
export async function loadNewRequestListPage(engagementId: number, sampleIdParam: string) {
  const [page, contacts] = await Promise.all([
    loadSamplePage(engagementId, sampleIdParam),
    listClientContactsByEngagementId(getDb(), { engagementId }),
  ]);
  return { ...page, contacts };
}

/** The sample's audit trail page: the filtered changes, the team to filter by, and the names the trail shows. */
export async function loadTrailPage(engagementId: number, sampleIdParam: string, query: AuditQuery) {
  const db = getDb();
  const sample = await getSampleById(db, { engagementId, sampleId: Number(sampleIdParam) });
  const [entries, members, context] = await Promise.all([
    listSampleAuditTrail(db, { sampleId: sample.id, query }),
    listMembersByEngagementId(db, { engagementId }),
    loadChangeContext(db, { sampleId: sample.id }),
  ]);
  return { sample, entries, members, context };
}
