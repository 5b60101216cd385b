import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { getAuditorConclusionBySampleId } from "@/lib/data/auditor-conclusions";
import { recordAuditorConclusion } from "@/lib/review/auditor-conclusion";
import { getReviewState } from "@/lib/review/review-state";
import { sampleOf } from "@/lib/samples/route-helpers";
import { AuditorConclusionSchema } from "@/lib/validation/conclusion";

/** The auditor's conclusion and response on the sample (null while none is recorded). */
export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const sample = await sampleOf(ctx);
  return { conclusion: await getAuditorConclusionBySampleId(ctx.db, { sampleId: sample.id }) };
});

/** The preparer records the auditor's conclusion and response (clears sign-offs; audited). */
export const PUT = withEngagementRole(AuditorConclusionSchema, "staff", async (input, ctx) => {
  const sample = await sampleOf(ctx);
  await recordAuditorConclusion(ctx.db, { sample, actorId: ctx.user.id, role: ctx.role, input });
  const [conclusion, review] = await Promise.all([
    getAuditorConclusionBySampleId(ctx.db, { sampleId: sample.id }),
    getReviewState(ctx.db, { sampleId: sample.id }),
  ]);
  return { conclusion, review };
});
