import "server-only";
import { notFound, redirect } from "next/navigation";
import { getDb } from "@/db/knex";
import { getUserById, type UserRecord } from "@/lib/data/users";
import { getMembershipRole } from "@/lib/data/members";
import { getEngagementById } from "@/lib/data/engagements";
import { getSessionUserId } from "./session-user";
import { CLIENT_ROLE, type EngagementRole } from "./roles";

/** For server pages: the signed-in active user, or a redirect to sign-in. */
export async function requirePageUser(): Promise<UserRecord> {
  const userId = await getSessionUserId();
  const user = userId === null ? null : await getUserById(getDb(), { userId });
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
export async function requireEngagementPage(engagementIdParam: string): Promise<{ user: UserRecord; role: EngagementRole; engagement: NonNullable<Awaited<ReturnType<typeof getEngagementById>>> }> {
  const user = await requirePageUser();
  const engagementId = Number(engagementIdParam);
  if (!Number.isSafeInteger(engagementId) || engagementId <= 0) notFound();
  const db = getDb();
  const [role, engagement] = await Promise.all([
    getMembershipRole(db, { engagementId, userId: user.id }),
    getEngagementById(db, { engagementId }),
  ]);
  if (!role || role === CLIENT_ROLE || !engagement) notFound();
  return { user, role, engagement };
}
