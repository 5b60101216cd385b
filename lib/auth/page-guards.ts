import "server-only";
import { cache } from "react";
import { notFound, redirect } from "next/navigation";
import { getDb } from "@/db/knex";
import { getUserById, type UserRecord } from "@/lib/data/users";
import { getMembershipRole } from "@/lib/data/members";
import { getEngagementById } from "@/lib/data/engagements";
import { getSessionUserId } from "./session-user";
import { CLIENT_ROLE, type EngagementRole } from "./roles";

/** The session's user, read once per request however many layouts and pages ask (React cache). */
const loadSessionUser = cache(async (): Promise<UserRecord | null> => {
  const userId = await getSessionUserId();
  return userId === null ? null : getUserById(getDb(), { userId });
});

/** The user's role on an engagement and the engagement, read once per request (React cache). */
const loadEngagementAccess = cache(async (engagementId: number, userId: number) => {
  const db = getDb();
  const [role, engagement] = await Promise.all([
    getMembershipRole(db, { engagementId, userId }),
    getEngagementById(db, { engagementId }),
  ]);
  return { role, engagement };
});

/** For server pages: the signed-in active user, or a redirect to sign-in. */
export async function requirePageUser(): Promise<UserRecord> {
  const user = await loadSessionUser();
  if (!user || !user.active) redirect("/sign-in");
  return user;
}

/** For the audit workspace: client staff are sent to their own request pages. */
export async function requireWorkspaceUser(): Promise<UserRecord> {
  const user = await requirePageUser();
  if (user.grade === "client") redirect("/requests");
  return user;
}

/** For the client's pages: a signed-in client contact (anyone else goes to the workspace). */
export async function requireClientPageUser(): Promise<UserRecord> {
  const user = await requirePageUser();
  if (user.grade !== "client") redirect("/engagements");
  return user;
}

/**
 * For engagement pages: the engagement and the user's auditor role on it; not-found for
 * non-members and for client contacts alike (the same rule as decideEngagementAccess).
 */
export async function requireEngagementPage(engagementIdParam: string): Promise<{
  user: UserRecord;
  role: EngagementRole;
  engagement: NonNullable<Awaited<ReturnType<typeof getEngagementById>>>;
}> {
  const user = await requirePageUser();
  const engagementId = Number(engagementIdParam);
  if (!Number.isSafeInteger(engagementId) || engagementId <= 0) notFound();
  const { role, engagement } = await loadEngagementAccess(engagementId, user.id);
  if (!role || role === CLIENT_ROLE || !engagement) notFound();
  return { user, role, engagement };
}
