import "server-only";
import type { Knex } from "knex";
import { SampleParamsSchema, type PlanSample, type SampleParams } from "@/lib/validation/sample";
import type { SamplePlan } from "@/lib/samples/plan";
import type { SelectionInputs } from "@/lib/samples/select";
import { recordAudit } from "./audit-log";
import { beginSampleWrite } from "@/lib/samples/guard";
import { conflict, notFound } from "@/lib/errors";
import {
  MethodologySettingsSchema,
  withMethodologyDefaults,
  type MethodologySettings,
} from "@/lib/validation/methodology";
import { StoredSamplePlanSchema, StoredSelectionInputsSchema } from "@/lib/samples/stored-plan";
import { parseJsonColumn } from "./json-column";
import { getMethodologyByFirmId, type MethodologyVersion } from "./firm-methodology";
import { mustExist } from "./must-exist";
import { CLEARED_CONCLUSION, parseAuditorResponses } from "./auditor-conclusions";
import type { AuditorResponse } from "@/lib/validation/conclusion";

export interface SampleRecord {
  id: number;
  engagementId: number;
  populationId: number;
  name: string;
  objective: string;
  assertion: string;
  direction: PlanSample["direction"];
  method: SampleParams["method"];
  estimator: string | null;
  params: SampleParams;
  plan: SamplePlan;
  computedSize: number;
  chosenSize: number;
  sizeReason: string | null;
  status: "planned" | "drawn";
  planVersion: number;
  /** The firm's methodology settings in force when the plan was last saved (defaults for older plans). */
  methodology: MethodologySettings;
  /** The firm's settings version stamped on the plan: 0 = shipped defaults, null = planned before settings existed. */
  methodologyVersion: number | null;
  createdAt: string;
  createdByName: string;
}

export interface DrawRecord {
  id: number;
  version: number;
  seed: number;
  /** "haphazard": no seed — the key items are set by the plan and the rest picked by the auditor. */
  seedSource: "generated" | "entered" | "haphazard";
  algorithm: string;
  algorithmVersion: string;
  populationSha256: string;
  inputs: SelectionInputs;
  selectionSha256: string;
  drawnAt: string;
  drawnByName: string;
  current: boolean;
  reperformedAt: string | null;
  reperformMatches: boolean | null;
}

/** A stored settings object: all of today's fields optional (older plans lack the later ones; withMethodologyDefaults fills them). */
const StoredMethodologySchema = MethodologySettingsSchema.partial().extend({
  nonstatistical: MethodologySettingsSchema.shape.nonstatistical.partial().optional(),
});
const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null);

function toSample(r: Record<string, unknown>): SampleRecord {
  return {
    id: Number(r.id),
    engagementId: Number(r.engagement_id),
    populationId: Number(r.population_id),
    name: String(r.name),
    objective: String(r.objective),
    assertion: String(r.assertion),
    direction: r.direction as SampleRecord["direction"],
    method: r.method as SampleRecord["method"],
    estimator: (r.estimator as string | null) ?? null,
    params: parseJsonColumn(SampleParamsSchema, r.params_json, "samples.params_json", Number(r.id)),
    plan: parseJsonColumn(StoredSamplePlanSchema, r.plan_json, "samples.plan_json", Number(r.id)),
    computedSize: Number(r.computed_size),
    chosenSize: Number(r.chosen_size),
    sizeReason: (r.size_reason as string | null) ?? null,
    status: r.status as SampleRecord["status"],
    planVersion: Number(r.plan_version),
    methodology: withMethodologyDefaults(
      r.methodology_json
        ? parseJsonColumn(StoredMethodologySchema, r.methodology_json, "samples.methodology_json", Number(r.id))
        : null,
    ),
    methodologyVersion:
      r.methodology_version === null || r.methodology_version === undefined ? null : Number(r.methodology_version),
    createdAt: iso(r.created_at)!,
    createdByName: String(r.created_by_name ?? ""),
  };
}

function toDraw(r: Record<string, unknown>): DrawRecord {
  return {
    id: Number(r.id),
    version: Number(r.version),
    seed: Number(r.seed),
    seedSource: r.seed_source as DrawRecord["seedSource"],
    algorithm: String(r.algorithm),
    algorithmVersion: String(r.algorithm_version),
    populationSha256: String(r.population_sha256),
    inputs: parseJsonColumn(StoredSelectionInputsSchema, r.inputs_json, "sample_draws.inputs_json", Number(r.id)),
    selectionSha256: String(r.selection_sha256),
    drawnAt: iso(r.drawn_at)!,
    drawnByName: String(r.drawn_by_name ?? ""),
    current: Boolean(r.current),
    reperformedAt: iso(r.reperformed_at),
    reperformMatches: r.reperform_matches === null ? null : Boolean(r.reperform_matches),
  };
}

const sampleQuery = (db: Knex) =>
  db("samples as s").join("users as u", "u.id", "s.created_by").select("s.*", "u.name as created_by_name");

export async function listSamplesByEngagementId(db: Knex, { engagementId }: { engagementId: number }) {
  return (await sampleQuery(db).where("s.engagement_id", engagementId).orderBy("s.id", "desc")).map(toSample);
}

export async function getSampleById(db: Knex, { engagementId, sampleId }: { engagementId: number; sampleId: number }) {
  const row = await sampleQuery(db).where({ "s.id": sampleId, "s.engagement_id": engagementId }).first();
  if (!row) throw notFound("No such sample");
  return toSample(row);
}

/** The settings a plan saved now is stamped with: those given (the ones the size was computed under), else the firm's current ones. */
async function methodologyStamp(trx: Knex.Transaction, engagementId: number, given?: MethodologyVersion) {
  let m = given;
  if (!m) {
    const engagement = mustExist(
      await trx("engagements").where({ id: engagementId }).first("firm_id"),
      `engagement ${engagementId}`,
    );
    m = await getMethodologyByFirmId(trx, { firmId: Number(engagement.firm_id) });
  }
  return { methodology_json: JSON.stringify(m.settings), methodology_version: m.version };
}

export async function createSample(
  db: Knex,
  {
    engagementId,
    actorId,
    input,
    plan,
    methodology,
  }: { engagementId: number; actorId: number; input: PlanSample; plan: SamplePlan; methodology?: MethodologyVersion },
) {
  return db.transaction(async (trx) => {
    const [id] = await trx("samples").insert({
      ...(await methodologyStamp(trx, engagementId, methodology)),
      engagement_id: engagementId,
      population_id: input.populationId,
      name: input.name,
      objective: input.objective,
      assertion: input.assertion,
      direction: input.direction,
      method: input.params.method,
      estimator: input.params.estimator ?? null,
      params_json: JSON.stringify(SampleParamsSchema.parse(input.params)),
      plan_json: JSON.stringify(plan),
      computed_size: plan.computedSize,
      chosen_size: plan.chosenSize,
      size_reason: input.params.sizeReason ?? null,
      created_by: actorId,
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      sampleId: id,
      entity: "sample",
      entityId: id,
      action: "plan",
      after: { ...input, computedSize: plan.computedSize, chosenSize: plan.chosenSize },
    });
    return getSampleById(trx, { engagementId, sampleId: id });
  });
}

/** Changes the plan of a sample not yet drawn; a drawn sample keeps its plan (draw again to change it). */
export async function updateSamplePlan(
  db: Knex,
  {
    engagementId,
    sampleId,
    actorId,
    input,
    plan,
    methodology,
  }: {
    engagementId: number;
    sampleId: number;
    actorId: number;
    input: PlanSample;
    plan: SamplePlan;
    methodology?: MethodologyVersion;
  },
) {
  return db.transaction(async (trx) => {
    const before = await trx("samples").where({ id: sampleId, engagement_id: engagementId }).forUpdate().first();
    if (!before) throw notFound("No such sample");
    if (before.status !== "planned")
      throw conflict("The sample has been drawn; its plan is final. Plan a new sample instead.");
    await beginSampleWrite(trx, { sampleId, actorId, what: "the plan" });
    await trx("samples")
      .where({ id: sampleId })
      .update({
        name: input.name,
        objective: input.objective,
        assertion: input.assertion,
        direction: input.direction,
        method: input.params.method,
        estimator: input.params.estimator ?? null,
        params_json: JSON.stringify(SampleParamsSchema.parse(input.params)),
        plan_json: JSON.stringify(plan),
        computed_size: plan.computedSize,
        chosen_size: plan.chosenSize,
        size_reason: input.params.sizeReason ?? null,
        plan_version: before.plan_version + 1,
        updated_at: trx.fn.now(3),
        ...(await methodologyStamp(trx, engagementId, methodology)),
      });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      sampleId,
      entity: "sample",
      entityId: sampleId,
      action: "replan",
      before: {
        params: parseJsonColumn(SampleParamsSchema, before.params_json, "samples.params_json", sampleId),
        chosenSize: before.chosen_size,
      },
      after: { params: input.params, chosenSize: plan.chosenSize },
    });
    return getSampleById(trx, { engagementId, sampleId });
  });
}

const drawQuery = (db: Knex) =>
  db("sample_draws as d").join("users as u", "u.id", "d.drawn_by").select("d.*", "u.name as drawn_by_name");

export async function listDrawsBySampleId(db: Knex, { sampleId }: { sampleId: number }) {
  return (await drawQuery(db).where("d.sample_id", sampleId).orderBy("d.version", "desc")).map(toDraw);
}

export async function getCurrentDraw(db: Knex, { sampleId }: { sampleId: number }): Promise<DrawRecord | null> {
  const row = await drawQuery(db).where({ "d.sample_id": sampleId, "d.current": true }).first();
  return row ? toDraw(row) : null;
}

/** What a write to a sample checks first: its lock, its sign-offs and the auditor's conclusion. */
export interface SampleWriteState {
  engagementId: number;
  lockedAt: Date | null;
  preparerSignedAt: Date | null;
  reviewerSignedAt: Date | null;
  auditorConclusion: string | null;
  auditorResponses: AuditorResponse[] | null;
  auditorConclusionAt: Date | null;
}

/**
 * The sample's write state, read plainly or under a row lock held to the end of the transaction:
 * "update" (exclusive) or "share" (other shared readers go on; exclusive writers wait). Null when no such sample.
 */
export async function getSampleWriteStateById(
  db: Knex | Knex.Transaction,
  { sampleId, lock }: { sampleId: number; lock?: "update" | "share" },
): Promise<SampleWriteState | null> {
  const q = db("samples").where({ id: sampleId });
  if (lock === "update") q.forUpdate();
  if (lock === "share") q.forShare();
  const row = await q.first(
    "engagement_id",
    "locked_at",
    "preparer_signed_at",
    "reviewer_signed_at",
    "auditor_conclusion",
    "auditor_responses_json",
    "auditor_conclusion_at",
  );
  if (!row) return null;
  return {
    engagementId: row.engagement_id,
    lockedAt: row.locked_at,
    preparerSignedAt: row.preparer_signed_at,
    reviewerSignedAt: row.reviewer_signed_at,
    auditorConclusion: row.auditor_conclusion,
    auditorResponses: parseAuditorResponses(row.auditor_responses_json, sampleId),
    auditorConclusionAt: row.auditor_conclusion_at,
  };
}

/** Clears the auditor's conclusion and response (the caller records why). */
export async function clearSampleConclusionById(trx: Knex.Transaction, { sampleId }: { sampleId: number }) {
  await trx("samples").where({ id: sampleId }).update(CLEARED_CONCLUSION);
}

/** Clears the preparer's and reviewer's sign-offs (the caller records why). */
export async function clearSampleSignOffsById(trx: Knex.Transaction, { sampleId }: { sampleId: number }) {
  await trx("samples").where({ id: sampleId }).update({
    preparer_signed_by: null,
    preparer_signed_role: null,
    preparer_signed_at: null,
    reviewer_signed_by: null,
    reviewer_signed_role: null,
    reviewer_signed_at: null,
  });
}

/** Marks the sample drawn (after a draw's items are in). */
export async function markSampleDrawnById(trx: Knex.Transaction, { sampleId }: { sampleId: number }) {
  await trx("samples")
    .where({ id: sampleId })
    .update({ status: "drawn", updated_at: trx.fn.now(3) });
}

/** The sample's status (planned or drawn), or undefined when no such sample. */
export async function getSampleStatusById(db: Knex | Knex.Transaction, { sampleId }: { sampleId: number }) {
  return (await db("samples").where({ id: sampleId }).first("status"))?.status;
}

/** Whether the engagement has this sample. */
export async function hasSampleById(
  db: Knex | Knex.Transaction,
  { engagementId, sampleId }: { engagementId: number; sampleId: number },
) {
  return Boolean(await db("samples").where({ id: sampleId, engagement_id: engagementId }).first("id"));
}

/** The names of the samples planned on a population. */
export async function listSampleNamesByPopulationId(
  db: Knex | Knex.Transaction,
  { populationId }: { populationId: number },
): Promise<string[]> {
  return db("samples").where({ population_id: populationId }).pluck("name");
}
