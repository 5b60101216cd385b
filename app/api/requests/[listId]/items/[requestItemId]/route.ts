import { parseIdParam } from "@/lib/auth/access";
import { withClientRequest } from "@/lib/auth/with-client";
import { setClientNote } from "@/lib/requests/files";
import { ClientNoteSchema } from "@/lib/validation/requests";

/** The client's note on a requested item. */
export const PATCH = withClientRequest(ClientNoteSchema, async ({ note }, { db, list, user, params }) => {
  await setClientNote(db, { list, requestItemId: parseIdParam(params.requestItemId, "item"), actorId: user.id, note });
});
