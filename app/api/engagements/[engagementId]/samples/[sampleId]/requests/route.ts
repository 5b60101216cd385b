import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { countRequestItemsByListId } from "@/lib/data/request-items";
import { getRequestListById, listRequestListsBySampleId } from "@/lib/data/request-lists";
import { notifyRequestListSent } from "@/lib/mail/notify-requests";
import { createRequestList } from "@/lib/requests/lists";
import { sampleOf } from "@/lib/samples/route-helpers";
import { CreateRequestListSchema } from "@/lib/validation/requests";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const sample = await sampleOf(ctx);
  return { requestLists: await listRequestListsBySampleId(ctx.db, { sampleId: sample.id }) };
});

/** A senior or above sends the client contact a request list from the drawn sample; the contact is e-mailed a link. */
export const POST = withEngagementRole(CreateRequestListSchema, "senior", async (input, ctx) => {
  const sample = await sampleOf(ctx);
  // The list and the message to its contact commit together (queued in the mail outbox in the same transaction).
  const { list, itemCount, mail } = await ctx.db.transaction(async (trx) => {
    const listId = await createRequestList(trx, { sample, actorId: ctx.user.id, input });
    const list = await getRequestListById(trx, { engagementId: ctx.engagementId, sampleId: sample.id, listId });
    const itemCount = await countRequestItemsByListId(trx, { listId });
    return { list, itemCount, mail: await notifyRequestListSent(trx, { list, itemCount }) };
  });
  return Response.json({ requestList: { ...list, itemCount }, mailSent: mail.sent }, { status: 201 });
});
