import "server-only";
import type { z } from "zod";
import { getUserWithMembershipRole } from "@/lib/data/users";
import { forbidden, unauthorised } from "@/lib/errors";
import { decideEngagementAccess, parseIdParam } from "./access";
import { getSessionUserId } from "./session-user";
import type { EngagementRole } from "./roles";
import { signedInUser, withAccess, type AccessRule, type Handler, type UserContext } from "./with-access";

export { assertSameSite, type UserContext } from "./with-access";

export interface EngagementContext extends UserContext {
  engagementId: number;
  role: EngagementRole;
}

/**
 * Access rule of every engagement route: session (401) → membership (404) → role (403). The
 * engagement id comes from the `engagementId` segment.
 */
export function engagementRole(leastRole: EngagementRole): AccessRule<EngagementContext> {
  return async (request) => {
    const userId = await getSessionUserId();
    if (userId === null) throw unauthorised();
    const engagementId = parseIdParam(request.params.engagementId, "engagement");
    const { user, membershipRole } = await getUserWithMembershipRole(request.db, { userId, engagementId });
    const role = decideEngagementAccess({ userId, userActive: Boolean(user?.active), membershipRole }, leastRole);
    return { ...request, user: user!, engagementId, role };
  };
}

/** Any signed-in, active user. */
export function withUser<S extends z.ZodType>(schema: S, handler: Handler<S, UserContext>) {
  return withAccess(signedInUser(), schema, handler);
}

/** A signed-in firm administrator. */
export function withFirmAdmin<S extends z.ZodType>(schema: S, handler: Handler<S, UserContext>) {
  return withAccess(
    signedInUser((user) => {
      if (user.firmRole !== "admin") throw forbidden("Only firm administrators may do this.");
    }),
    schema,
    handler,
  );
}

/** A signed-in member of the audit firm: client staff (grade client) are refused with 403. */
export function withAuditor<S extends z.ZodType>(schema: S, handler: Handler<S, UserContext>) {
  return withAccess(
    signedInUser((user) => {
      if (user.grade === "client") throw forbidden("Client contacts see only their own request lists.");
    }),
    schema,
    handler,
  );
}

/** An engagement route: session (401) → membership (404) → role (403) → input (400 naming the field) → handler. */
export function withEngagementRole<S extends z.ZodType>(
  schema: S,
  leastRole: EngagementRole,
  handler: Handler<S, EngagementContext>,
) {
  return withAccess(engagementRole(leastRole), schema, handler);
}

/** The same checks for handlers that read the request body themselves (file uploads); the query string is validated. */
export function withEngagementRoleStreaming<S extends z.ZodType>(
  querySchema: S,
  leastRole: EngagementRole,
  handler: Handler<S, EngagementContext>,
) {
  return withAccess(engagementRole(leastRole), querySchema, handler, "query");
}
