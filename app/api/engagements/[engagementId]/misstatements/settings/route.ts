import { withEngagementRole } from "@/lib/auth/with-role";
import { saveSummarySettings } from "@/lib/misstatements/entries";
import { loadSummaryView } from "@/lib/misstatements/summary-view";
import { SummarySettingsSchema } from "@/lib/validation/misstatements";

/** Managers and partners set the clearly trivial threshold and the share of performance materiality that counts as approaching. */
export const PUT = withEngagementRole(SummarySettingsSchema, "manager", async (input, ctx) => {
  await saveSummarySettings(ctx.db, { engagementId: ctx.engagementId, actorId: ctx.user.id, input });
  return { summary: await loadSummaryView(ctx.db, { engagementId: ctx.engagementId }) };
});
