import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { clearNote, listNotesBySampleId } from "@/lib/data/review-notes";
import { notifyNote } from "@/lib/review/notifications";
import { sampleOf } from "@/lib/samples/route-helpers";

/** The reviewer clears an answered note. */
export const POST = withEngagementRole(z.object({}), "manager", async (_input, ctx) => {
  const sample = await sampleOf(ctx);
  const noteId = parseIdParam(ctx.params.noteId, "review note");
  await ctx.db.transaction(async (trx) => {
    await clearNote(trx, { sample, actorId: ctx.user.id, noteId });
    await notifyNote(trx, { sample, noteId, kind: "cleared", actor: ctx.user });
  });
  return { notes: await listNotesBySampleId(ctx.db, { sampleId: sample.id }) };
});
