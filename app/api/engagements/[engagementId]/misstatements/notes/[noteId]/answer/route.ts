import { parseIdParam } from "@/lib/auth/access";
import { withEngagementRole } from "@/lib/auth/with-role";
import { answerSummaryNote, listSummaryNotes } from "@/lib/misstatements/notes";
import { AnswerNoteSchema } from "@/lib/validation/review";

export const POST = withEngagementRole(AnswerNoteSchema, "staff", async ({ answer }, ctx) => {
  await answerSummaryNote(ctx.db, {
    engagementId: ctx.engagementId,
    actorId: ctx.user.id,
    noteId: parseIdParam(ctx.params.noteId, "review note"),
    answer,
  });
  return { notes: await listSummaryNotes(ctx.db, { engagementId: ctx.engagementId }) };
});
