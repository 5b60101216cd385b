import "server-only";
import type { Knex } from "knex";
import { createUser, revokePassword, type UserRecord } from "@/lib/data/users";
import { createInvitation, unusablePasswordHash, withdrawInvitations } from "@/lib/requests/invitations";
import type { CreateUser } from "@/lib/validation/user";

/** A person and the one-time link token to choose their password (only its SHA-256 is stored). */
export interface PersonWithLink {
  user: UserRecord;
  token: string;
}

/** A firm administrator adds a person: the account cannot sign in until its owner chooses a password with the link (audited). */
export async function inviteFirmPerson(
  db: Knex,
  { firmId, actorId, input }: { firmId: number; actorId: number; input: CreateUser },
): Promise<PersonWithLink> {
  const passwordHash = await unusablePasswordHash();
  return db.transaction(async (trx) => {
    const user = await createUser(trx, { firmId, actorId, input, passwordHash });
    return { user, token: await createInvitation(trx, { userId: user.id, actorId }) };
  });
}

/**
 * A password reset: the old password stops working, the person's open sessions end, earlier links are
 * withdrawn, and a new one-time link lets them choose a new password (audited, one transaction).
 */
export async function resetPasswordWithLink(
  db: Knex,
  { firmId, actorId, userId }: { firmId: number; actorId: number; userId: number },
): Promise<PersonWithLink> {
  const passwordHash = await unusablePasswordHash();
  return db.transaction(async (trx) => {
    const user = await revokePassword(trx, { firmId, actorId, userId, passwordHash });
    await withdrawInvitations(trx, { userId });
    return { user, token: await createInvitation(trx, { userId, actorId }) };
  });
}
