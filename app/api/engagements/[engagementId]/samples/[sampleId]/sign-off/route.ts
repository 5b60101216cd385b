import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { hasAtLeastRole } from "@/lib/auth/roles";
import { forbidden } from "@/lib/errors";
import { signOffAsPreparer, signOffAsReviewer } from "@/lib/review/sign-offs";
import { getReviewState } from "@/lib/review/review-state";
import { notifyReadyForReview } from "@/lib/review/notifications";
import { sampleOf } from "@/lib/samples/route-helpers";

const SignOffSchema = z.object({ as: z.enum(["preparer", "reviewer"], "Sign off as preparer or reviewer") });

export const POST = withEngagementRole(SignOffSchema, "staff", async ({ as }, ctx) => {
  const sample = await sampleOf(ctx);
  if (as === "preparer") {
    await ctx.db.transaction(async (trx) => {
      await signOffAsPreparer(trx, { sample, actorId: ctx.user.id, role: ctx.role });
      await notifyReadyForReview(trx, { sample, preparer: ctx.user });
    });
  } else {
    if (!hasAtLeastRole(ctx.role, "manager")) throw forbidden("Reviewer sign-off needs the manager or partner role.");
    await signOffAsReviewer(ctx.db, { sample, actorId: ctx.user.id, role: ctx.role });
  }
  return { review: await getReviewState(ctx.db, { sampleId: sample.id }) };
});
