import "server-only";
import type { Knex } from "knex";
import { getEngagementById } from "@/lib/data/engagements";
import { getPopulationById } from "@/lib/data/populations";
import { getMethodologyByFirmId } from "@/lib/data/firm-methodology";
import { getSampleById, listDrawsBySampleId } from "@/lib/data/samples";
import { listItemsByDrawId } from "@/lib/data/sample-items";
import { notFound } from "@/lib/errors";
import type { PreviewPlan } from "@/lib/validation/sample";
import { loadFrame } from "./population-frame";
import { computePlan } from "./plan";
import { loadPriorSpread } from "./plan-spread";
import type { Estimator } from "@/lib/sampling";
import { evaluateSample } from "./evaluate";
import { getReviewState } from "@/lib/review/review-state";

/**
 * The plan for a population and parameters, with the engagement's performance materiality as the
 * default TM, sized under the firm's current methodology — returned so that saving stamps the very
 * settings the size was computed under (assurance-factor table, MUS size method and factor mode, the
 * hypergeometric threshold, the control-frequency table). `input.params` is what to store: the
 * confidence the risk assessment maps to replaces a typed one.
 */
export async function planFor<T extends PreviewPlan>(
  db: Knex,
  { engagementId, input }: { engagementId: number; input: T },
) {
  const [engagement, population] = await Promise.all([
    getEngagementById(db, { engagementId }),
    getPopulationById(db, { engagementId, populationId: input.populationId }),
  ]);
  if (!engagement) throw notFound("No such engagement");
  const [frame, methodology] = await Promise.all([
    loadFrame(db, { populationId: population.id }),
    getMethodologyByFirmId(db, { firmId: engagement.firmId }),
  ]);
  const params = input.params;
  const classical = params.method === "random" || params.method === "systematic";
  const priorSpread =
    classical && params.spreadBasis === "prior-sample" && params.spreadSampleId !== undefined
      ? await loadPriorSpread(db, {
          engagementId,
          sampleId: params.spreadSampleId,
          estimator: (params.estimator ?? "mean-per-unit") as Estimator,
        })
      : undefined;
  const plan = computePlan(frame, params, engagement.performanceMateriality, {
    methodology: methodology.settings,
    methodologyVersion: methodology.version,
    priorSpread,
    direction: input.direction ?? "both",
  });
  const normalised: T = { ...input, params: { ...params, confidence: plan.risk?.confidence ?? params.confidence } };
  return { plan, population, engagement, methodology, input: normalised };
}

export async function loadSampleView(db: Knex, { engagementId, sampleId }: { engagementId: number; sampleId: number }) {
  const sample = await getSampleById(db, { engagementId, sampleId });
  const [population, draws, engagement, review] = await Promise.all([
    getPopulationById(db, { engagementId, populationId: sample.populationId }),
    listDrawsBySampleId(db, { sampleId }),
    getEngagementById(db, { engagementId }),
    getReviewState(db, { sampleId }),
  ]);
  return {
    sample,
    population,
    draws,
    currentDraw: draws.find((d) => d.current) ?? null,
    engagement: engagement!,
    review,
  };
}

export type SampleView = Awaited<ReturnType<typeof loadSampleView>>;

/** The view, every item of its current draw, and the evaluation of those items — one read of each. */
export async function loadSampleWithEvaluation(
  db: Knex,
  { engagementId, sampleId }: { engagementId: number; sampleId: number },
) {
  const view = await loadSampleView(db, { engagementId, sampleId });
  const items = view.currentDraw ? (await listItemsByDrawId(db, { drawId: view.currentDraw.id })).items : [];
  return {
    view,
    items,
    evaluation: evaluateSample(view.sample, view.population, items, view.engagement.performanceMateriality),
  };
}

export async function evaluationFor(db: Knex, { engagementId, sampleId }: { engagementId: number; sampleId: number }) {
  return (await loadSampleWithEvaluation(db, { engagementId, sampleId })).evaluation;
}
