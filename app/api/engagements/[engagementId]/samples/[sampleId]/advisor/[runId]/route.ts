import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import {
  getAdvisorRunById,
  isAdvisorRunOrphaned,
  markAdvisorRunInterrupted,
  requestAdvisorCancel,
} from "@/lib/data/advisor-runs";
import { instanceId } from "@/lib/workers/instance-id";
import { cancelAdvisorRun, isAdvisorRunning } from "@/lib/advisor/runner";
import { sampleOf } from "@/lib/samples/route-helpers";
import { conflict } from "@/lib/errors";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const sample = await sampleOf(ctx);
  const runId = parseIdParam(ctx.params.runId, "advisor run");
  const run = await getAdvisorRunById(ctx.db, { sampleId: sample.id, runId });
  if (
    run.status !== "running" ||
    !(await isAdvisorRunOrphaned(ctx.db, {
      runId: run.id,
      serverId: instanceId(),
      runningHere: isAdvisorRunning(run.id),
    }))
  )
    return { run };
  await markAdvisorRunInterrupted(ctx.db, { runId: run.id });
  return { run: await getAdvisorRunById(ctx.db, { sampleId: sample.id, runId }) };
});

/**
 * Cancels a run in progress from any app server: at once when this server runs it, otherwise
 * through the cancel flag its server polls every second. Its stream ends with {type:"cancelled"}.
 */
export const DELETE = withEngagementRole(z.object({}), "senior", async (_input, ctx) => {
  const sample = await sampleOf(ctx);
  const run = await getAdvisorRunById(ctx.db, {
    sampleId: sample.id,
    runId: parseIdParam(ctx.params.runId, "advisor run"),
  });
  if (run.status !== "running" || !(await requestAdvisorCancel(ctx.db, { runId: run.id })))
    throw conflict(`This advisor run is not running (it is ${run.status}).`);
  cancelAdvisorRun(run.id);
  return undefined;
});
