import "server-only";
import type { Knex } from "knex";
import { getEngagementById } from "@/lib/data/engagements";
import { getUserById } from "@/lib/data/users";
import { engagementUrl } from "./links";
import { sendMail, type MailResult } from "./send";

/**
 * Tells a person they were added to an engagement's team. Call it inside `addMember`'s transaction;
 * like every notice it never throws, so a mail failure cannot fail the request.
 */
export async function notifyEngagementInvitation(
  db: Knex,
  {
    engagementId,
    userId,
    role,
    invitedBy,
  }: { engagementId: number; userId: number; role: string; invitedBy: { name: string } },
): Promise<MailResult | null> {
  try {
    const [engagement, person] = await Promise.all([
      getEngagementById(db, { engagementId }),
      getUserById(db, { userId }),
    ]);
    if (!engagement || !person) return null;
    return await sendMail(db, {
      to: { name: person.name, email: person.email },
      template: "engagement-invitation",
      data: {
        recipient: { name: person.name },
        invitedBy,
        role,
        engagement: { clientName: engagement.clientName, name: engagement.name, periodEnd: engagement.periodEnd },
        engagementUrl: engagementUrl(engagementId),
        addedAt: new Date(),
      },
    });
  } catch (err) {
    console.error(
      `mail: engagement-invitation for user ${userId} not sent — ${err instanceof Error ? err.message : String(err)}`,
    );
    return { sent: false, to: `user ${userId}`, reason: err instanceof Error ? err.message : String(err) };
  }
}
