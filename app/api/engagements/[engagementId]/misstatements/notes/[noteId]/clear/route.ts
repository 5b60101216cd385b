import { z } from "zod";
import { parseIdParam } from "@/lib/auth/access";
import { withEngagementRole } from "@/lib/auth/with-role";
import { clearSummaryNote, listSummaryNotes } from "@/lib/misstatements/notes";

export const POST = withEngagementRole(z.object({}), "manager", async (_input, ctx) => {
  await clearSummaryNote(ctx.db, {
    engagementId: ctx.engagementId,
    actorId: ctx.user.id,
    noteId: parseIdParam(ctx.params.noteId, "review note"),
  });
  return { notes: await listSummaryNotes(ctx.db, { engagementId: ctx.engagementId }) };
});
