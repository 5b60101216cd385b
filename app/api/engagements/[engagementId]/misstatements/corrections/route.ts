import { withEngagementRole } from "@/lib/auth/with-role";
import { saveSampleCorrection } from "@/lib/misstatements/entries";
import { loadSummaryView } from "@/lib/misstatements/summary-view";
import { SampleCorrectionSchema } from "@/lib/validation/misstatements";

/** Marks the factual or projected part of a sample's row as corrected by the client (or, with `corrected: null`, not). */
export const POST = withEngagementRole(SampleCorrectionSchema, "staff", async (input, ctx) => {
  await saveSampleCorrection(ctx.db, { engagementId: ctx.engagementId, actorId: ctx.user.id, input });
  return { summary: await loadSummaryView(ctx.db, { engagementId: ctx.engagementId }) };
});
