import "server-only";
import type { z } from "zod";
import { getDb, type Knex } from "@/db/knex";
import { getUserById, type UserRecord } from "@/lib/data/users";
import { errorToResponse, notFound, unauthorised, validationError } from "@/lib/errors";
import { getRequestListRowForContact, type RequestListRow } from "@/lib/requests/lists";
import { parseIdParam } from "./access";
import { readInput } from "./read-input";
import { assertSameSite } from "./with-role";
import { getSessionUserId } from "./session-user";

type RouteParams = { params: Promise<Record<string, string>> };
type Handler<S extends z.ZodType, C> = (input: z.output<S>, ctx: C) => Promise<unknown>;

export interface ClientContext { db: Knex; user: UserRecord; req: Request; params: Record<string, string> }
export interface ClientRequestContext extends ClientContext { list: RequestListRow }

function answer(result: unknown): Response {
  if (result instanceof Response) return result;
  return result === undefined ? new Response(null, { status: 204 }) : Response.json(result);
}

async function clientUser(db: Knex, req: Request): Promise<UserRecord> {
  assertSameSite(req);
  const userId = await getSessionUserId();
  const user = userId === null ? null : await getUserById(db, { userId });
  if (!user || !user.active) throw unauthorised();
  return user;
}

/**
 * The client's side of Sondage: session (401) → the request list named by `listId`, addressed to
 * this user, who is still a client contact on its engagement (404 for anything else, so no other
 * list, sample or engagement is revealed) → input (400) → handler.
 */
async function authoriseList(req: Request, route: RouteParams): Promise<ClientRequestContext> {
  const db = getDb();
  const params = await route.params;
  const user = await clientUser(db, req);
  const list = await getRequestListRowForContact(db, { listId: parseIdParam(params.listId, "request list"), contactUserId: user.id });
  if (!list) throw notFound("No such request list");
  return { db, user, req, params, list };
}

export function withClientRequest<S extends z.ZodType>(schema: S, handler: Handler<S, ClientRequestContext>) {
  return async (req: Request, route: RouteParams): Promise<Response> => {
    try {
      const ctx = await authoriseList(req, route);
      const parsed = schema.safeParse(await readInput(req));
      if (!parsed.success) throw validationError(parsed.error);
      return answer(await handler(parsed.data, ctx));
    } catch (err) {
      return errorToResponse(err);
    }
  };
}

/** The same checks for uploads, whose body the handler reads itself; the query string is validated. */
export function withClientRequestStreaming<S extends z.ZodType>(querySchema: S, handler: Handler<S, ClientRequestContext>) {
  return async (req: Request, route: RouteParams): Promise<Response> => {
    try {
      const ctx = await authoriseList(req, route);
      const parsed = querySchema.safeParse(Object.fromEntries(new URL(req.url).searchParams));
      if (!parsed.success) throw validationError(parsed.error);
      return answer(await handler(parsed.data, ctx));
    } catch (err) {
      return errorToResponse(err);
    }
  };
}

/** Any signed-in client contact: their own request lists only. */
export function withClientUser<S extends z.ZodType>(schema: S, handler: Handler<S, ClientContext>) {
  return async (req: Request, route: RouteParams): Promise<Response> => {
    try {
      const db = getDb();
      const params = await route.params;
      const user = await clientUser(db, req);
      const parsed = schema.safeParse(await readInput(req));
      if (!parsed.success) throw validationError(parsed.error);
      return answer(await handler(parsed.data, { db, user, req, params }));
    } catch (err) {
      return errorToResponse(err);
    }
  };
}
