import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { answerNote, listNotesBySampleId } from "@/lib/data/review-notes";
import { notifyNote } from "@/lib/review/notifications";
import { sampleOf } from "@/lib/samples/route-helpers";
import { AnswerNoteSchema } from "@/lib/validation/review";

/** The preparer (staff and above) answers a note. */
export const POST = withEngagementRole(AnswerNoteSchema, "staff", async ({ answer }, ctx) => {
  const sample = await sampleOf(ctx);
  const noteId = parseIdParam(ctx.params.noteId, "review note");
  await ctx.db.transaction(async (trx) => {
    await answerNote(trx, { sample, actorId: ctx.user.id, noteId, answer });
    await notifyNote(trx, { sample, noteId, kind: "answered", actor: ctx.user });
  });
  return { notes: await listNotesBySampleId(ctx.db, { sampleId: sample.id }) };
});
