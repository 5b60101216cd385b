import "server-only";
import type { z } from "zod";
import { getDb, type Knex } from "@/db/knex";
import { getUserById, type UserRecord } from "@/lib/data/users";
import { getMembershipRole } from "@/lib/data/members";
import { AppError, errorToResponse, forbidden, unauthorised, validationError } from "@/lib/errors";
import { isCrossSiteWrite } from "@/lib/security/headers";
import { decideEngagementAccess, parseIdParam } from "./access";
import { readInput } from "./read-input";
import { getSessionUserId } from "./session-user";
import type { EngagementRole } from "./roles";

type RouteParams = { params: Promise<Record<string, string>> };
type Handler<S extends z.ZodType, C> = (input: z.output<S>, ctx: C) => Promise<unknown>;

export interface UserContext { db: Knex; user: UserRecord; req: Request; params: Record<string, string> }
export interface EngagementContext extends UserContext { engagementId: number; role: EngagementRole }

function answer(result: unknown): Response {
  if (result instanceof Response) return result;
  return result === undefined ? new Response(null, { status: 204 }) : Response.json(result);
}

async function parseWith<S extends z.ZodType>(schema: S, req: Request): Promise<z.output<S>> {
  const parsed = schema.safeParse(await readInput(req));
  if (!parsed.success) throw validationError(parsed.error);
  return parsed.data;
}

/** Writes sent from another site's page are refused before anything else (403 cross_site). */
export function assertSameSite(req: Request): void {
  const url = new URL(req.url);
  if (isCrossSiteWrite({ method: req.method, headers: req.headers, host: req.headers.get("host") ?? url.host })) {
    throw new AppError(403, "cross_site", "Requests from another site are refused.");
  }
}

async function loadActiveUser(db: Knex): Promise<UserRecord> {
  const userId = await getSessionUserId();
  const user = userId === null ? null : await getUserById(db, { userId });
  if (!user || !user.active) throw unauthorised();
  return user;
}

/** A signed-in user who passes `check` (403 otherwise) before the input is read, so a refused caller learns nothing from validation. */
function withCheckedUser<S extends z.ZodType>(check: (user: UserRecord) => void, schema: S, handler: Handler<S, UserContext>) {
  return async (req: Request, route: RouteParams): Promise<Response> => {
    try {
      assertSameSite(req);
      const db = getDb();
      const params = await route.params;
      const user = await loadActiveUser(db);
      check(user);
      const input = await parseWith(schema, req);
      return answer(await handler(input, { db, user, req, params }));
    } catch (err) {
      return errorToResponse(err);
    }
  };
}

/** Any signed-in, active user. */
export function withUser<S extends z.ZodType>(schema: S, handler: Handler<S, UserContext>) {
  return withCheckedUser(() => {}, schema, handler);
}

/** A signed-in firm administrator. */
export function withFirmAdmin<S extends z.ZodType>(schema: S, handler: Handler<S, UserContext>) {
  return withCheckedUser((user) => { if (user.firmRole !== "admin") throw forbidden("Only firm administrators may do this."); }, schema, handler);
}

/** A signed-in member of the audit firm: client staff (grade client) are refused with 403. */
export function withAuditor<S extends z.ZodType>(schema: S, handler: Handler<S, UserContext>) {
  return withCheckedUser((user) => { if (user.grade === "client") throw forbidden("Client contacts see only their own request lists."); }, schema, handler);
}

/**
 * Every engagement route goes through here: session (401) → membership (404) → role (403) →
 * input (400 naming the field) → handler. The engagement id comes from the `engagementId` segment.
 */
export function withEngagementRole<S extends z.ZodType>(schema: S, leastRole: EngagementRole, handler: Handler<S, EngagementContext>) {
  return async (req: Request, route: RouteParams): Promise<Response> => {
    try {
      const ctx = await authoriseEngagement(req, route, leastRole);
      const input = await parseWith(schema, req);
      return answer(await handler(input, ctx));
    } catch (err) {
      return errorToResponse(err);
    }
  };
}

/** The same checks for handlers that read the request body themselves (file uploads); the query string is validated. */
export function withEngagementRoleStreaming<S extends z.ZodType>(querySchema: S, leastRole: EngagementRole, handler: Handler<S, EngagementContext>) {
  return async (req: Request, route: RouteParams): Promise<Response> => {
    try {
      const ctx = await authoriseEngagement(req, route, leastRole);
      const parsed = querySchema.safeParse(Object.fromEntries(new URL(req.url).searchParams));
      if (!parsed.success) throw validationError(parsed.error);
      return answer(await handler(parsed.data, ctx));
    } catch (err) {
      return errorToResponse(err);
    }
  };
}

async function authoriseEngagement(req: Request, route: RouteParams, leastRole: EngagementRole): Promise<EngagementContext> {
  assertSameSite(req);
  const db = getDb();
  const params = await route.params;
  const userId = await getSessionUserId();
  if (userId === null) throw unauthorised();
  const engagementId = parseIdParam(params.engagementId, "engagement");
  const [user, membershipRole] = await Promise.all([getUserById(db, { userId }), getMembershipRole(db, { engagementId, userId })]);
  const role = decideEngagementAccess({ userId, userActive: Boolean(user?.active), membershipRole }, leastRole);
  return { db, user: user!, req, params, engagementId, role };
}
