import { withEngagementRole } from "@/lib/auth/with-role";
import { createEntry } from "@/lib/misstatements/entries";
import { loadSummaryView } from "@/lib/misstatements/summary-view";
import { EntrySchema } from "@/lib/validation/misstatements";

/** Staff and above enter factual, judgemental and prior-period misstatements found outside sampling. */
export const POST = withEngagementRole(EntrySchema, "staff", async (input, ctx) => {
  const { entry, signOffsCleared } = await createEntry(ctx.db, {
    engagementId: ctx.engagementId,
    actorId: ctx.user.id,
    input,
  });
  return Response.json(
    { entry, signOffsCleared, summary: await loadSummaryView(ctx.db, { engagementId: ctx.engagementId }) },
    { status: 201 },
  );
});
