import { z } from "zod";
import { withClientRequest } from "@/lib/auth/with-client";
import { notFound } from "@/lib/errors";
import { storedFileResponse } from "@/lib/files/download";
import { requestFileOf } from "@/lib/requests/route-helpers";

/** A file of the client's own request list, exactly as they sent it. */
export const GET = withClientRequest(z.object({}), async (_input, ctx) => {
  const file = await requestFileOf(ctx, ctx.list.id);
  if (!file) throw notFound("No such file on this request list");
  return storedFileResponse(file);
});
