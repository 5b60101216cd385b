import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { listAdvisorRunsBySampleId } from "@/lib/data/advisor-runs";
import { startAdvisorRun } from "@/lib/advisor/start-run";
import { sampleOf } from "@/lib/samples/route-helpers";
import { AdvisorRunSchema } from "@/lib/validation/advisor";
import { loadAdvisorState } from "@/lib/advisor/state";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const sample = await sampleOf(ctx);
  return loadAdvisorState(ctx.db, sample, await listAdvisorRunsBySampleId(ctx.db, { sampleId: sample.id }));
});

export const POST = withEngagementRole(AdvisorRunSchema, "senior", async (input, ctx) =>
  startAdvisorRun(ctx, await sampleOf(ctx), input),
);
