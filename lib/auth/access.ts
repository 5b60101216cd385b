import { AppError, forbidden, notFound, unauthorised } from "@/lib/errors";
import { CLIENT_ROLE, hasAtLeastRole, type EngagementRole, type MembershipRole } from "./roles";

export interface AccessFacts {
  userId: number | null;
  userActive: boolean;
  membershipRole: MembershipRole | null;
}

/**
 * The one decision behind every engagement route: 401 without an active session, 404 when the
 * user is not on the engagement (so its existence is never revealed), 403 below the least role.
 * A client contact is treated as not on the engagement: 404 from every auditor route, whatever
 * the least role, so they learn nothing of the team's work (their own routes use withClientRequest).
 */
export function decideEngagementAccess(facts: AccessFacts, leastRole: EngagementRole): EngagementRole {
  if (facts.userId === null || !facts.userActive) throw unauthorised();
  if (facts.membershipRole === null || facts.membershipRole === CLIENT_ROLE) throw notFound("No such engagement");
  if (!hasAtLeastRole(facts.membershipRole, leastRole)) {
    throw forbidden(`This needs the ${leastRole} role or above on the engagement; you are ${facts.membershipRole}.`);
  }
  return facts.membershipRole;
}

export function parseIdParam(value: string | undefined, name: string): number {
  const id = Number(value);
  if (!value || !/^\d{1,10}$/.test(value) || !Number.isSafeInteger(id) || id <= 0) {
    throw new AppError(404, "not_found", `No such ${name}`);
  }
  return id;
}
