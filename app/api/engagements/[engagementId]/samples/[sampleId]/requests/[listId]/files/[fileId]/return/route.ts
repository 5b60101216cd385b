import { parseIdParam } from "@/lib/auth/access";
import { withEngagementRole } from "@/lib/auth/with-role";
import { notifyRequestFileReturned } from "@/lib/mail/notify-requests";
import { returnClientFile } from "@/lib/requests/files";
import { listOf } from "@/lib/requests/route-helpers";
import { ReturnFileSchema } from "@/lib/validation/requests";

/** Staff and above send a client's file back with a reason; the client is e-mailed it. */
export const POST = withEngagementRole(ReturnFileSchema, "staff", async ({ reason }, ctx) => {
  const list = await listOf(ctx);
  const { result, mail } = await ctx.db.transaction(async (trx) => {
    const result = await returnClientFile(trx, {
      list,
      fileId: parseIdParam(ctx.params.fileId, "file"),
      actorId: ctx.user.id,
      reason,
    });
    const mail = await notifyRequestFileReturned(trx, {
      list,
      returnedBy: { name: ctx.user.name },
      itemRef: result.itemRef,
      fileName: result.fileName,
      reason,
    });
    return { result, mail };
  });
  return { itemStatus: result.itemStatus, mailSent: mail.sent };
});
