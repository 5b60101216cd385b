import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { listSummaryNotes, raiseSummaryNote } from "@/lib/misstatements/notes";
import { SummaryNoteSchema } from "@/lib/validation/misstatements";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => ({
  notes: await listSummaryNotes(ctx.db, { engagementId: ctx.engagementId }),
}));

/** Reviewers (manager, partner) raise notes on the summary. */
export const POST = withEngagementRole(SummaryNoteSchema, "manager", async ({ text }, ctx) => {
  await raiseSummaryNote(ctx.db, { engagementId: ctx.engagementId, actorId: ctx.user.id, text });
  return Response.json({ notes: await listSummaryNotes(ctx.db, { engagementId: ctx.engagementId }) }, { status: 201 });
});
