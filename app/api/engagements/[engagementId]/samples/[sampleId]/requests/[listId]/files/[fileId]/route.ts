import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { notFound } from "@/lib/errors";
import { storedFileResponse } from "@/lib/files/download";
import { listOf, requestFileOf } from "@/lib/requests/route-helpers";

/** A file the client uploaded, exactly as stored. */
export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const file = await requestFileOf(ctx, (await listOf(ctx)).id);
  if (!file) throw notFound("No such file on this request list");
  return storedFileResponse(file);
});
