import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "./audit-log";
import { parseJsonColumn } from "./json-column";
import { StoredAdvisorRequestSchema, StoredAdvisorResultSchema } from "@/lib/advisor/stored-run";
import { beginSampleWrite } from "@/lib/samples/guard";
import { conflict, fieldError, notFound } from "@/lib/errors";
import { ADVISED_ESTIMATOR_LABELS, type AdvisedEstimator } from "@/lib/sampling/advise";
import type { AdvisorResult } from "@/lib/advisor/compute";
import type { MisstatementScenario, Sides } from "@/lib/sampling";

/** What a run was asked to do, stored as given (the scenario resolved to the engine's terms). */
export interface AdvisorRequest {
  scenario: MisstatementScenario;
  /** How the scenario was chosen on screen (a pattern, or an earlier sample by id and name). */
  scenarioSource:
    { kind: "pattern" } | { kind: "previous-sample"; sampleId: number; sampleName: string; results: number };
  sampleSizes: number[];
  trials: number;
  seed: number;
  seedSource: "generated" | "entered";
  confidence: number;
  sides: Sides;
  method: string;
  plannedSize: number;
}

export interface AdvisorRunRecord {
  id: number;
  sampleId: number;
  populationId: number;
  planVersion: number;
  status: "running" | "done" | "cancelled" | "failed";
  request: AdvisorRequest;
  result: AdvisorResult | null;
  error: string | null;
  durationMs: number | null;
  createdAt: string;
  createdByName: string;
  finishedAt: string | null;
}

const parseResult = (v: unknown, runId: number) =>
  v === null || v === undefined
    ? null
    : parseJsonColumn(StoredAdvisorResultSchema, v, "advisor_runs.result_json", runId);
const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null);

function toRun(r: Record<string, unknown>): AdvisorRunRecord {
  return {
    id: Number(r.id),
    sampleId: Number(r.sample_id),
    populationId: Number(r.population_id),
    planVersion: Number(r.plan_version),
    status: r.status as AdvisorRunRecord["status"],
    request: parseJsonColumn(StoredAdvisorRequestSchema, r.request_json, "advisor_runs.request_json", Number(r.id)),
    result: parseResult(r.result_json, Number(r.id)),
    error: (r.error as string | null) ?? null,
    durationMs: r.duration_ms === null ? null : Number(r.duration_ms),
    createdAt: iso(r.created_at)!,
    createdByName: String(r.created_by_name ?? ""),
    finishedAt: iso(r.finished_at),
  };
}

const runQuery = (db: Knex) =>
  db("advisor_runs as a").join("users as u", "u.id", "a.created_by").select("a.*", "u.name as created_by_name");

export async function getAdvisorRunById(
  db: Knex,
  { sampleId, runId }: { sampleId: number; runId: number },
): Promise<AdvisorRunRecord> {
  const row = await runQuery(db).where({ "a.id": runId, "a.sample_id": sampleId }).first();
  if (!row) throw notFound("No such advisor run");
  return toRun(row);
}

/** Runs of a sample, newest first, without their results (the list stays small). */
export async function listAdvisorRunsBySampleId(db: Knex, { sampleId }: { sampleId: number }) {
  const rows = await db("advisor_runs as a")
    .join("users as u", "u.id", "a.created_by")
    .where("a.sample_id", sampleId)
    .orderBy("a.id", "desc")
    .limit(50)
    .select(
      "a.id",
      "a.sample_id",
      "a.population_id",
      "a.plan_version",
      "a.status",
      "a.request_json",
      "a.error",
      "a.duration_ms",
      "a.created_at",
      "a.finished_at",
      "u.name as created_by_name",
    );
  return rows.map((r: Record<string, unknown>) => toRun({ ...r, result_json: null }));
}

export async function findDoneAdvisorRunByKey(
  db: Knex,
  { sampleId, cacheKey }: { sampleId: number; cacheKey: string },
) {
  const row = await runQuery(db)
    .where({ "a.sample_id": sampleId, "a.cache_key": cacheKey, "a.status": "done" })
    .orderBy("a.id", "desc")
    .first();
  return row ? toRun(row) : null;
}

export async function createAdvisorRun(
  db: Knex,
  o: {
    engagementId: number;
    sampleId: number;
    populationId: number;
    planVersion: number;
    cacheKey: string;
    request: AdvisorRequest;
    actorId: number;
  },
) {
  return db.transaction(async (trx) => {
    const [id] = await trx("advisor_runs").insert({
      engagement_id: o.engagementId,
      sample_id: o.sampleId,
      population_id: o.populationId,
      plan_version: o.planVersion,
      cache_key: o.cacheKey,
      request_json: JSON.stringify(o.request),
      created_by: o.actorId,
    });
    await recordAudit(trx, {
      actorUserId: o.actorId,
      engagementId: o.engagementId,
      sampleId: o.sampleId,
      entity: "advisor_run",
      entityId: id,
      action: "start",
      after: o.request,
    });
    return Number(id);
  });
}

export async function finishAdvisorRun(
  db: Knex,
  o: {
    engagementId: number;
    sampleId: number;
    runId: number;
    actorId: number;
    status: "done" | "cancelled" | "failed";
    result?: AdvisorResult;
    error?: string;
    durationMs: number;
  },
) {
  await db.transaction(async (trx) => {
    await trx("advisor_runs")
      .where({ id: o.runId, status: "running" })
      .update({
        status: o.status,
        result_json: o.result ? JSON.stringify(o.result) : null,
        error: o.error ?? null,
        duration_ms: o.durationMs,
        finished_at: trx.fn.now(3),
      });
    await recordAudit(trx, {
      actorUserId: o.actorId,
      engagementId: o.engagementId,
      sampleId: o.sampleId,
      entity: "advisor_run",
      entityId: o.runId,
      action: o.status,
      after: {
        durationMs: o.durationMs,
        recommended: o.result?.recommendation.recommended ?? null,
        error: o.error ?? null,
      },
    });
  });
}

/** A row left "running" by a server that stopped: marked failed so nobody waits on it. */
/** How long a running run's heartbeat may be silent before its server counts as stopped. */
export const ADVISOR_HEARTBEAT_SECONDS = 30;

/**
 * Called about once a second by the server running the run: records that it is alive and answers
 * whether a cancel was asked for (from any server, by requestAdvisorCancel).
 */
export async function advisorHeartbeat(
  db: Knex,
  { runId, serverId }: { runId: number; serverId: string },
): Promise<{ cancelRequested: boolean }> {
  await db("advisor_runs")
    .where({ id: runId, status: "running" })
    .update({ heartbeat_at: db.fn.now(3), server_id: serverId });
  const row = await db("advisor_runs").where({ id: runId }).first("cancel_requested_at");
  return { cancelRequested: Boolean(row?.cancel_requested_at) };
}

/** Asks whichever server runs the run to stop it; false when it is not running. */
export async function requestAdvisorCancel(db: Knex, { runId }: { runId: number }): Promise<boolean> {
  return (
    (await db("advisor_runs")
      .where({ id: runId, status: "running" })
      .update({ cancel_requested_at: db.fn.now(3) })) === 1
  );
}

/** True when a "running" run's server has stopped: this server ran it and no longer does, or its heartbeat went silent. */
export async function isAdvisorRunOrphaned(
  db: Knex,
  { runId, serverId, runningHere }: { runId: number; serverId: string; runningHere: boolean },
): Promise<boolean> {
  if (runningHere) return false;
  const row: { server_id: string | null; silent: unknown } | undefined = await db("advisor_runs")
    .where({ id: runId })
    .first(
      "server_id",
      db.raw(`COALESCE(heartbeat_at, created_at) < NOW(3) - INTERVAL ${ADVISOR_HEARTBEAT_SECONDS} SECOND as silent`),
    );
  return row?.server_id === serverId || Boolean(Number(row?.silent));
}

export async function markAdvisorRunInterrupted(db: Knex, { runId }: { runId: number }) {
  await db("advisor_runs")
    .where({ id: runId, status: "running" })
    .update({
      status: "failed",
      error: "Interrupted: the server stopped before the run finished.",
      finished_at: db.fn.now(3),
    });
}

/** The estimator a plan evaluates with, as the advisor names it (null for methods it does not simulate). */
export function planEstimatorOf(sample: { method: string; estimator: string | null }): AdvisedEstimator | null {
  if (sample.method === "mus") return "stringer";
  if (sample.method === "random" || sample.method === "systematic")
    return (sample.estimator as AdvisedEstimator | null) ?? null;
  return null;
}

/**
 * Makes a finished run the plan's stated rationale for the method; the plan must not be drawn yet.
 * The run must have simulated the plan's own estimator; one whose recommendation differs from the
 * plan, or that found none meeting the confidence, is kept only with a written reason.
 */
export async function adoptAdvisorRun(
  db: Knex,
  {
    engagementId,
    sampleId,
    runId,
    actorId,
    reason,
  }: { engagementId: number; sampleId: number; runId: number; actorId: number; reason?: string },
) {
  return db.transaction(async (trx) => {
    const sample = await trx("samples")
      .where({ id: sampleId, engagement_id: engagementId })
      .forUpdate()
      .first("status", "advisor_run_id", "advisor_run_reason", "method", "estimator");
    if (!sample) throw notFound("No such sample");
    if (sample.status !== "planned")
      throw conflict("The sample has been drawn; the rationale for its method is final.");
    const run = await trx("advisor_runs").where({ id: runId, sample_id: sampleId }).first("status", "result_json");
    if (!run) throw notFound("No such advisor run");
    if (run.status !== "done") throw conflict("Only a finished advisor run can be the rationale for the method.");
    const result = parseJsonColumn(StoredAdvisorResultSchema, run.result_json, "advisor_runs.result_json", runId);
    const planned = planEstimatorOf({ method: String(sample.method), estimator: sample.estimator ?? null });
    const label = planned ? ADVISED_ESTIMATOR_LABELS[planned].toLowerCase() : "the plan's estimator";
    if (!planned || !result.cells.some((c) => c.estimator === planned)) {
      throw conflict(
        `This run did not simulate the plan's estimator (${label}), so it cannot be the rationale for the method. Run the advisor again, or change the plan.`,
      );
    }
    const recommended = result.recommendation.recommended;
    if ((recommended === null || recommended !== planned) && !reason) {
      const why =
        recommended === null
          ? "found no estimator meeting the confidence"
          : `recommends ${ADVISED_ESTIMATOR_LABELS[recommended].toLowerCase()}, not the plan's ${label}`;
      throw fieldError("reason", `This run ${why}: write why the plan's method stands despite it.`);
    }
    await beginSampleWrite(trx, { sampleId, actorId, what: "the method's rationale" });
    await trx("samples")
      .where({ id: sampleId })
      .update({ advisor_run_id: runId, advisor_run_reason: reason ?? null });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      sampleId,
      entity: "sample",
      entityId: sampleId,
      action: "adopt-advisor-run",
      before: { advisorRunId: sample.advisor_run_id, reason: sample.advisor_run_reason ?? null },
      after: { advisorRunId: runId, reason: reason ?? null },
    });
  });
}

export async function getAdoptedAdvisorRun(
  db: Knex,
  { sampleId }: { sampleId: number },
): Promise<(AdvisorRunRecord & { keptReason: string | null }) | null> {
  const row = await db("samples").where({ id: sampleId }).first("advisor_run_id", "advisor_run_reason");
  if (!row?.advisor_run_id) return null;
  return {
    ...(await getAdvisorRunById(db, { sampleId, runId: Number(row.advisor_run_id) })),
    keptReason: row.advisor_run_reason ?? null,
  };
}
