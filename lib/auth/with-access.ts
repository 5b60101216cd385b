import "server-only";
import type { z } from "zod";
import { getDb, type Knex } from "@/db/knex";
import { getUserById, type UserRecord } from "@/lib/data/users";
import { AppError, errorToResponse, unauthorised, validationError } from "@/lib/errors";
import { isCrossSiteWrite } from "@/lib/security/headers";
import { readInput } from "./read-input";
import { getSessionUserId } from "./session-user";

type RouteParams = { params: Promise<Record<string, string>> };

/** What every route handler gets before its access rule has run. */
export interface RequestContext {
  db: Knex;
  req: Request;
  params: Record<string, string>;
}
export interface UserContext extends RequestContext {
  user: UserRecord;
}

/**
 * Who may call a route: from the request, the context the handler works with, or a thrown 401, 403
 * or 404. A rule runs before the input is read, so a refused caller learns nothing from validation.
 */
export type AccessRule<C> = (request: RequestContext) => Promise<C>;

export type Handler<S extends z.ZodType, C> = (input: z.output<S>, ctx: C) => Promise<unknown>;

/** Where the input is read: the JSON body (or query string of a GET), or only the query string for handlers that stream the body themselves (uploads). */
export type InputSource = "body" | "query";

/**
 * The one route wrapper: same-site check (403) → access rule (401/403/404) → input (400 naming the
 * field) → handler → JSON answer (204 when the handler returns nothing). Anything thrown becomes the
 * error answer `{ error: { code, message, fields? } }`.
 */
export function withAccess<S extends z.ZodType, C>(
  rule: AccessRule<C>,
  schema: S,
  handler: Handler<S, C>,
  source: InputSource = "body",
) {
  return async (req: Request, route: RouteParams): Promise<Response> => {
    try {
      assertSameSite(req);
      const ctx = await rule({ db: getDb(), req, params: await route.params });
      const raw = source === "query" ? Object.fromEntries(new URL(req.url).searchParams) : await readInput(req);
      const parsed = schema.safeParse(raw);
      if (!parsed.success) throw validationError(parsed.error);
      return answer(await handler(parsed.data, ctx));
    } catch (err) {
      return errorToResponse(err);
    }
  };
}

function answer(result: unknown): Response {
  if (result instanceof Response) return result;
  return result === undefined ? new Response(null, { status: 204 }) : Response.json(result);
}

/** Writes sent from another site's page are refused before anything else (403 cross_site). */
export function assertSameSite(req: Request): void {
  const url = new URL(req.url);
  if (isCrossSiteWrite({ method: req.method, headers: req.headers, host: req.headers.get("host") ?? url.host })) {
    throw new AppError(403, "cross_site", "Requests from another site are refused.");
  }
}

/** The signed-in, active user (401 otherwise). */
export async function loadActiveUser(db: Knex): Promise<UserRecord> {
  const userId = await getSessionUserId();
  const user = userId === null ? null : await getUserById(db, { userId });
  if (!user || !user.active) throw unauthorised();
  return user;
}

/** Access rule: a signed-in, active user who passes `check` (which throws 403 to refuse). */
export function signedInUser(check: (user: UserRecord) => void = () => {}): AccessRule<UserContext> {
  return async (request) => {
    const user = await loadActiveUser(request.db);
    check(user);
    return { ...request, user };
  };
}
