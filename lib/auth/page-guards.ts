import "server-only";
import { notFound, redirect } from "next/navigation";
import { getDb } from "@/db/knex";
import { getUserById, type UserRecord } from "@/lib/data/users";
import { getMembershipRole } from "@/lib/data/members";
import { getEngagementById } from "@/lib/data/engagements";
import { getSessionUserId } from "./session-user";

/** For server pages: the signed-in active user, or a redirect to sign-in. */
export async function requirePageUser(): Promise<UserRecord> {
  const userId = await getSessionUserId();
  const user = userId === null ? null : await getUserById(getDb(), { userId });
  if (!user || !user.active) redirect("/sign-in");
  return user;
}

/** For engagement pages: the engagement and the user's role on it; not-found for non-members. */
export async function requireEngagementPage(engagementIdParam: string) {
  const user = await requirePageUser();
  const engagementId = Number(engagementIdParam);
  if (!Number.isSafeInteger(engagementId) || engagementId <= 0) notFound();
  const db = getDb();
  const [role, engagement] = await Promise.all([
    getMembershipRole(db, { engagementId, userId: user.id }),
    getEngagementById(db, { engagementId }),
  ]);
  if (!role || !engagement) notFound();
  return { user, role, engagement };
}
