import { z } from "zod";
import { parseIdParam } from "@/lib/auth/access";
import { withEngagementRole } from "@/lib/auth/with-role";
import { deleteEntry, updateEntry } from "@/lib/misstatements/entries";
import { loadSummaryView } from "@/lib/misstatements/summary-view";
import { EntryUpdateSchema } from "@/lib/validation/misstatements";

export const PATCH = withEngagementRole(EntryUpdateSchema, "staff", async (input, ctx) => {
  const { entry, signOffsCleared } = await updateEntry(ctx.db, {
    engagementId: ctx.engagementId,
    entryId: parseIdParam(ctx.params.entryId, "misstatement entry"),
    actorId: ctx.user.id,
    input,
  });
  return { entry, signOffsCleared, summary: await loadSummaryView(ctx.db, { engagementId: ctx.engagementId }) };
});

/** Soft delete, kept in the audit trail. */
export const DELETE = withEngagementRole(z.object({}), "staff", async (_input, ctx) => {
  await deleteEntry(ctx.db, {
    engagementId: ctx.engagementId,
    entryId: parseIdParam(ctx.params.entryId, "misstatement entry"),
    actorId: ctx.user.id,
  });
});
