import "server-only";
import { ndjsonOf, ndjsonStream } from "@/lib/http/ndjson";
import { createHash, randomInt } from "node:crypto";
import type { Knex } from "knex";
import { observedTaintings, type MisstatementScenario } from "@/lib/sampling";
import type { EngagementContext } from "@/lib/auth/with-role";
import { getSampleById, getCurrentDraw, type SampleRecord } from "@/lib/data/samples";
import { listItemsByDrawId } from "@/lib/data/sample-items";
import {
  advisorHeartbeat,
  createAdvisorRun,
  findDoneAdvisorRunByKey,
  finishAdvisorRun,
  getAdvisorRunById,
  type AdvisorRequest,
} from "@/lib/data/advisor-runs";
import { instanceId } from "@/lib/workers/instance-id";
import { AppError, conflict, fieldError } from "@/lib/errors";
import { loadFrame } from "@/lib/samples/population-frame";
import { sidesFor } from "@/lib/samples/evaluate";
import { factorModeOfSample } from "@/lib/samples/methodology";
import type { AdvisorRun } from "@/lib/validation/advisor";
import {
  AdvisorCancelled,
  AdvisorInputError,
  MAX_CONCURRENT_RUNS,
  advisorRunsInProgress,
  cancelAdvisorRun,
  runInWorker,
} from "./runner";
import { jobUnits, type AdvisorJob } from "./compute";
import { ADVISED_METHODS } from "./methods";
import { countOf, formatCount } from "@/lib/format/number";

/** 409 unless the advisor applies: a plan not yet drawn, with a classical or monetary-unit method. */
export function assertAdvisable(sample: SampleRecord) {
  if (sample.status !== "planned")
    throw conflict("The advisor runs on a plan before it is drawn; this sample has been drawn.");
  if (!ADVISED_METHODS.includes(sample.method))
    throw conflict(
      "The advisor compares estimators for simple random, systematic and monetary-unit samples; it is not available for stratified or attribute samples.",
    );
}

async function resolveScenario(
  db: Knex,
  ctx: EngagementContext,
  input: AdvisorRun,
  sample: SampleRecord,
): Promise<Pick<AdvisorRequest, "scenario" | "scenarioSource">> {
  const s = input.scenario;
  if (s.kind === "pattern") {
    return {
      scenario: {
        kind: "pattern",
        misstatedShare: s.misstatedPercent / 100,
        tainting: s.tainting,
        overstatementShare: s.overstatementPercent / 100,
      },
      scenarioSource: { kind: "pattern" },
    };
  }
  if (s.sampleId === sample.id)
    throw fieldError(
      "scenario.sampleId",
      "choose an earlier sample, not this one",
      "Choose an earlier sample, not this one",
    );
  const previous = await getSampleById(db, { engagementId: ctx.engagementId, sampleId: s.sampleId });
  const draw = await getCurrentDraw(db, { sampleId: previous.id });
  const items = draw ? (await listItemsByDrawId(db, { drawId: draw.id })).items : [];
  // As in the evaluation, an item that could not be audited counts as wholly misstated (audited 0).
  const results = items
    .filter((it) => (it.status === "done" && it.auditedValue !== null) || it.status === "not-auditable")
    .map((it) => ({
      bookValue: Number(it.bookValue),
      auditedValue: it.status === "not-auditable" ? 0 : Number(it.auditedValue),
    }));
  if (results.length === 0)
    throw conflict(`"${previous.name}" has no recorded audited values to take misstatements from.`);
  const observed = observedTaintings(results);
  const scenario: MisstatementScenario = {
    kind: "observed",
    misstatedShare: observed.misstatedShare,
    taintings: observed.taintings,
  };
  return {
    scenario,
    scenarioSource: {
      kind: "previous-sample",
      sampleId: previous.id,
      sampleName: previous.name,
      results: results.length,
    },
  };
}

const cacheKeyOf = (populationId: number, r: AdvisorRequest) =>
  createHash("sha256")
    .update(
      JSON.stringify([
        populationId,
        r.method,
        r.confidence,
        r.sides,
        r.plannedSize,
        r.scenario,
        r.sampleSizes,
        r.trials,
        r.seed,
      ]),
    )
    .digest("hex");

/**
 * Starts an advisor run for a plan and answers with its progress as NDJSON lines:
 * {type:"started", runId, total} · {type:"progress", done, total} · then one of
 * {type:"result", run, cached} · {type:"cancelled", runId} · {type:"error", message}.
 * A finished run with the same population, plan figures, scenario, sizes, trials and seed is
 * answered from the database at once. Closing the stream cancels the run.
 */
export async function startAdvisorRun(
  ctx: EngagementContext,
  sample: SampleRecord,
  input: AdvisorRun,
): Promise<Response> {
  const { db } = ctx;
  assertAdvisable(sample);
  const frame = await loadFrame(db, { populationId: sample.populationId });
  for (const n of input.sampleSizes) {
    if (n > frame.bookValues.length)
      throw fieldError(
        "sampleSizes",
        `${formatCount(n)} is more than the population's ${countOf(frame.bookValues.length, "item")}`,
      );
  }
  const request: AdvisorRequest = {
    ...(await resolveScenario(db, ctx, input, sample)),
    sampleSizes: [...input.sampleSizes].sort((a, b) => a - b),
    trials: input.trials,
    seed: input.seed ?? randomInt(0, 2 ** 32),
    seedSource: input.seed === undefined ? "generated" : "entered",
    confidence: sample.params.confidence,
    sides: sidesFor(sample.direction),
    method: sample.method,
    plannedSize: sample.chosenSize,
  };
  const cacheKey = cacheKeyOf(sample.populationId, request);

  const cached = await findDoneAdvisorRunByKey(db, { sampleId: sample.id, cacheKey });
  if (cached) return ndjsonOf({ type: "result", run: cached, cached: true });

  if (advisorRunsInProgress() >= MAX_CONCURRENT_RUNS) {
    throw new AppError(
      503,
      "busy",
      `The advisor is already running ${MAX_CONCURRENT_RUNS} simulations on this server (the limit is per app server); try again when one has finished.`,
    );
  }
  const runId = await createAdvisorRun(db, {
    engagementId: ctx.engagementId,
    sampleId: sample.id,
    populationId: sample.populationId,
    planVersion: sample.planVersion,
    cacheKey,
    request,
    actorId: ctx.user.id,
  });
  const job: AdvisorJob = {
    bookValues: frame.bookValues,
    scenario: request.scenario,
    sampleSizes: request.sampleSizes,
    trials: request.trials,
    seed: request.seed,
    confidence: request.confidence,
    sides: request.sides,
    plannedSize: request.plannedSize,
    includeStringer: sample.method === "mus",
    factors: factorModeOfSample(sample),
  };
  const started = Date.now();
  const finish = (
    status: "done" | "cancelled" | "failed",
    extra: { result?: Awaited<ReturnType<typeof runInWorker>>; error?: string },
  ) =>
    finishAdvisorRun(db, {
      engagementId: ctx.engagementId,
      sampleId: sample.id,
      runId,
      actorId: ctx.user.id,
      status,
      durationMs: Date.now() - started,
      ...extra,
    });

  const response = ndjsonStream<object>(
    async (send) => {
      send({ type: "started", runId, total: jobUnits(job) });
      // Once a second: a heartbeat (so other servers know the run is alive) and the cancel flag,
      // which DELETE …/advisor/:r sets from whichever server it reaches.
      const serverId = instanceId();
      const poll = setInterval(() => {
        advisorHeartbeat(db, { runId, serverId }).then(
          ({ cancelRequested }) => {
            if (cancelRequested) cancelAdvisorRun(runId);
          },
          () => undefined,
        );
      }, 1_000);
      try {
        const result = await runInWorker(runId, job, (done, total) => send({ type: "progress", done, total }));
        await finish("done", { result });
        send({ type: "result", run: await getAdvisorRunById(db, { sampleId: sample.id, runId }), cached: false });
      } catch (err) {
        if (err instanceof AdvisorCancelled) {
          await finish("cancelled", {});
          send({ type: "cancelled", runId });
        } else {
          const message =
            err instanceof AdvisorInputError
              ? err.message
              : "The advisor run failed on our side; the error has been logged.";
          if (!(err instanceof AdvisorInputError)) console.error("[sondage] advisor run failed", err);
          await finish("failed", { error: message });
          send({ type: "error", message });
        }
      } finally {
        clearInterval(poll);
      }
    },
    () => cancelAdvisorRun(runId),
  );
  ctx.req.signal?.addEventListener("abort", () => cancelAdvisorRun(runId), { once: true });
  return response;
}
