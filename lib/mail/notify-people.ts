import "server-only";
import type { Knex } from "knex";
import { getFirmNameById } from "@/lib/data/firms";
import { INVITATION_DAYS } from "@/lib/requests/invitations";
import { invitationUrl } from "./links";
import { sendMail, type MailResult } from "./send";

/** A member of the firm gets the one-time link to choose a password; give it the transaction that creates the link (never throws). */
export async function notifyStaffInvitation(
  db: Knex,
  a: {
    person: { name: string; email: string };
    token: string;
    invitedBy: { name: string };
    firmId: number;
    reason: "new" | "reset";
  },
): Promise<MailResult> {
  try {
    const firmName = await getFirmNameById(db, { firmId: a.firmId });
    return await sendMail(db, {
      to: a.person,
      template: "staff-invitation",
      data: {
        recipient: { name: a.person.name },
        invitedBy: a.invitedBy,
        firmName: firmName ?? "Your firm",
        reason: a.reason,
        actionUrl: invitationUrl(a.token),
        expiresInDays: INVITATION_DAYS,
      },
    });
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    console.error(`mail: staff-invitation to ${a.person.email} not sent — ${reason}`);
    return { sent: false, to: a.person.email, reason };
  }
}
