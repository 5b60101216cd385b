import { withEngagementRole } from "@/lib/auth/with-role";
import { unlockSample } from "@/lib/review/lock";
import { getReviewState } from "@/lib/review/review-state";
import { sampleOf } from "@/lib/samples/route-helpers";
import { UnlockSchema } from "@/lib/validation/review";

export const POST = withEngagementRole(UnlockSchema, "partner", async ({ reason }, ctx) => {
  const sample = await sampleOf(ctx);
  await unlockSample(ctx.db, { sample, actorId: ctx.user.id, role: ctx.role, reason });
  return { review: await getReviewState(ctx.db, { sampleId: sample.id }) };
});
