import { withEngagementRole } from "@/lib/auth/with-role";
import { hasAtLeastRole } from "@/lib/auth/roles";
import { forbidden } from "@/lib/errors";
import { signSummaryAsPreparer, signSummaryAsReviewer } from "@/lib/misstatements/review";
import { loadSummaryView } from "@/lib/misstatements/summary-view";
import { SummarySignOffSchema } from "@/lib/validation/misstatements";

export const POST = withEngagementRole(SummarySignOffSchema, "staff", async ({ as }, ctx) => {
  if (as === "preparer")
    await signSummaryAsPreparer(ctx.db, { engagementId: ctx.engagementId, actorId: ctx.user.id, role: ctx.role });
  else {
    if (!hasAtLeastRole(ctx.role, "manager")) throw forbidden("Reviewer sign-off needs the manager or partner role.");
    await signSummaryAsReviewer(ctx.db, { engagementId: ctx.engagementId, actorId: ctx.user.id, role: ctx.role });
  }
  return { summary: await loadSummaryView(ctx.db, { engagementId: ctx.engagementId }) };
});
