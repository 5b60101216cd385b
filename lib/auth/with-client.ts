import "server-only";
import type { z } from "zod";
import { notFound } from "@/lib/errors";
import { getContactRequestListById, type RequestListRow } from "@/lib/data/request-lists";
import { parseIdParam } from "./access";
import { signedInUser, withAccess, type AccessRule, type Handler, type UserContext } from "./with-access";

export type ClientContext = UserContext;
export interface ClientRequestContext extends ClientContext {
  list: RequestListRow;
}

/**
 * Access rule of the client's side of Sondage: session (401) → the request list named by `listId`,
 * addressed to this user, who is still a client contact on its engagement (404 for anything else,
 * so no other list, sample or engagement is revealed).
 */
export const clientRequestList: AccessRule<ClientRequestContext> = async (request) => {
  const ctx = await signedInUser()(request);
  const list = await getContactRequestListById(ctx.db, {
    listId: parseIdParam(ctx.params.listId, "request list"),
    contactUserId: ctx.user.id,
  });
  if (!list) throw notFound("No such request list");
  return { ...ctx, list };
};

export function withClientRequest<S extends z.ZodType>(schema: S, handler: Handler<S, ClientRequestContext>) {
  return withAccess(clientRequestList, schema, handler);
}

/** The same checks for uploads, whose body the handler reads itself; the query string is validated. */
export function withClientRequestStreaming<S extends z.ZodType>(
  querySchema: S,
  handler: Handler<S, ClientRequestContext>,
) {
  return withAccess(clientRequestList, querySchema, handler, "query");
}

/** Any signed-in client contact: their own request lists only (the handler's queries are scoped to the user). */
export function withClientUser<S extends z.ZodType>(schema: S, handler: Handler<S, ClientContext>) {
  return withAccess(signedInUser(), schema, handler);
}
