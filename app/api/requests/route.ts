import { z } from "zod";
import { withClientUser } from "@/lib/auth/with-client";
import { listClientSummaries } from "@/lib/requests/client-lists";

/** The signed-in client contact's own request lists (an empty list for anyone else). */
export const GET = withClientUser(z.object({}), async (_input, { db, user }) => ({
  requestLists: await listClientSummaries(db, { contactUserId: user.id }),
}));
