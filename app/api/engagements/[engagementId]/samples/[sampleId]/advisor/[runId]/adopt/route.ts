import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { adoptAdvisorRun, listAdvisorRunsBySampleId } from "@/lib/data/advisor-runs";
import { loadAdvisorState } from "@/lib/advisor/state";
import { sampleOf } from "@/lib/samples/route-helpers";
import { AdoptAdvisorRunSchema } from "@/lib/validation/advisor";

/** Stores a finished run with the plan as the rationale for its method (printed in the workpaper, with the reason when one is required). */
export const POST = withEngagementRole(AdoptAdvisorRunSchema, "senior", async (input, ctx) => {
  const sample = await sampleOf(ctx);
  await adoptAdvisorRun(ctx.db, {
    engagementId: ctx.engagementId,
    sampleId: sample.id,
    runId: parseIdParam(ctx.params.runId, "advisor run"),
    actorId: ctx.user.id,
    reason: input.reason,
  });
  return loadAdvisorState(
    ctx.db,
    await sampleOf(ctx),
    await listAdvisorRunsBySampleId(ctx.db, { sampleId: sample.id }),
  );
});
