import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { updateSamplePlan } from "@/lib/data/samples";
import { loadSampleView, planFor } from "@/lib/samples/context";
import { sampleOf } from "@/lib/samples/route-helpers";
import { conflict } from "@/lib/errors";
import { PlanSampleSchema } from "@/lib/validation/sample";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const sample = await sampleOf(ctx);
  return loadSampleView(ctx.db, { engagementId: ctx.engagementId, sampleId: sample.id });
});

export const PATCH = withEngagementRole(PlanSampleSchema, "senior", async (input, ctx) => {
  const sample = await sampleOf(ctx);
  if (sample.status !== "planned")
    throw conflict("The sample has been drawn; its plan is final. Plan a new sample instead.");
  const planned = await planFor(ctx.db, { engagementId: ctx.engagementId, input });
  return {
    sample: await updateSamplePlan(ctx.db, {
      engagementId: ctx.engagementId,
      sampleId: sample.id,
      actorId: ctx.user.id,
      input: planned.input,
      plan: planned.plan,
      methodology: planned.methodology,
    }),
  };
});
