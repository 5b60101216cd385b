import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { listNotesBySampleId, raiseNote } from "@/lib/data/review-notes";
import { notifyNote } from "@/lib/review/notifications";
import { sampleOf } from "@/lib/samples/route-helpers";
import { RaiseNoteSchema } from "@/lib/validation/review";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => ({
  notes: await listNotesBySampleId(ctx.db, { sampleId: (await sampleOf(ctx)).id }),
}));

/** Reviewers (manager, partner) raise notes on the sample or one of its items. */
export const POST = withEngagementRole(RaiseNoteSchema, "manager", async (input, ctx) => {
  const sample = await sampleOf(ctx);
  // The note and its notice commit together (the notice is queued in the mail outbox in the same transaction).
  await ctx.db.transaction(async (trx) => {
    const noteId = await raiseNote(trx, { sample, actorId: ctx.user.id, ...input });
    await notifyNote(trx, { sample, noteId, kind: "raised", actor: ctx.user });
  });
  return Response.json({ notes: await listNotesBySampleId(ctx.db, { sampleId: sample.id }) }, { status: 201 });
});
