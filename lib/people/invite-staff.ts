import "server-only";
import type { Knex } from "knex";
import { createUser, revokePassword, type UserRecord } from "@/lib/data/users";
import type { MailResult } from "@/lib/mail/send";
import { notifyStaffInvitation } from "@/lib/mail/notify-people";
import { createInvitation, unusablePasswordHash, withdrawInvitations } from "@/lib/requests/invitations";
import type { CreateUser } from "@/lib/validation/user";

/** The person, and their one-time link's message as queued in the mail outbox (only the link token's SHA-256 is stored). */
export interface InvitedPerson {
  user: UserRecord;
  mail: MailResult;
}

/**
 * A firm administrator adds a person: the account cannot sign in until its owner chooses a password
 * with the link (audited). The link's message is queued in the same transaction: both commit, or neither.
 */
export async function inviteFirmPerson(
  db: Knex,
  {
    firmId,
    actorId,
    input,
    invitedBy,
  }: { firmId: number; actorId: number; input: CreateUser; invitedBy: { name: string } },
): Promise<InvitedPerson> {
  const passwordHash = await unusablePasswordHash();
  return db.transaction(async (trx) => {
    const user = await createUser(trx, { firmId, actorId, input, passwordHash });
    const token = await createInvitation(trx, { userId: user.id, actorId });
    const mail = await notifyStaffInvitation(trx, { person: user, token, invitedBy, firmId, reason: "new" });
    return { user, mail };
  });
}

/**
 * A password reset: the old password stops working, the person's open sessions end, earlier links are
 * withdrawn, and a new one-time link lets them choose a new password (audited; the link's message is
 * queued in the same transaction).
 */
export async function resetPasswordWithLink(
  db: Knex,
  {
    firmId,
    actorId,
    userId,
    invitedBy,
  }: { firmId: number; actorId: number; userId: number; invitedBy: { name: string } },
): Promise<InvitedPerson> {
  const passwordHash = await unusablePasswordHash();
  return db.transaction(async (trx) => {
    const user = await revokePassword(trx, { firmId, actorId, userId, passwordHash });
    await withdrawInvitations(trx, { userId });
    const token = await createInvitation(trx, { userId, actorId });
    const mail = await notifyStaffInvitation(trx, { person: user, token, invitedBy, firmId, reason: "reset" });
    return { user, mail };
  });
}
