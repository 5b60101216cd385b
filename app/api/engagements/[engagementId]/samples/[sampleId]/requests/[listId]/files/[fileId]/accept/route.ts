import { z } from "zod";
import { parseIdParam } from "@/lib/auth/access";
import { withEngagementRole } from "@/lib/auth/with-role";
import { acceptClientFile } from "@/lib/requests/files";
import { listOf } from "@/lib/requests/route-helpers";

/** Staff and above accept a client's file: it becomes evidence on the sample item. */
export const POST = withEngagementRole(z.object({}), "staff", async (_input, ctx) => {
  const list = await listOf(ctx);
  return acceptClientFile(ctx.db, { list, fileId: parseIdParam(ctx.params.fileId, "file"), actorId: ctx.user.id });
});
