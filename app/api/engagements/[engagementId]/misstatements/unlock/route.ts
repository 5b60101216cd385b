import { withEngagementRole } from "@/lib/auth/with-role";
import { unlockSummary } from "@/lib/misstatements/review";
import { loadSummaryView } from "@/lib/misstatements/summary-view";
import { UnlockSchema } from "@/lib/validation/review";

export const POST = withEngagementRole(UnlockSchema, "partner", async ({ reason }, ctx) => {
  await unlockSummary(ctx.db, { engagementId: ctx.engagementId, actorId: ctx.user.id, role: ctx.role, reason });
  return { summary: await loadSummaryView(ctx.db, { engagementId: ctx.engagementId }) };
});
