import "server-only";
import { createHash, randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { BCRYPT_COST, setPasswordHashByUserId } from "@/lib/data/users";
import {
  expireOpenInvitationsByUserId,
  getOpenInvitationByTokenSha256,
  insertInvitation,
  spendInvitationById,
} from "@/lib/data/user-invitations";
import { AppError } from "@/lib/errors";

/** How long an invitation link stays valid. */
export const INVITATION_DAYS = 14;

const digest = (token: string) => createHash("sha256").update(token).digest("hex");

/** The hash of a random password nobody is told: the account cannot sign in until its owner chooses one with a link. */
export const unusablePasswordHash = () => bcrypt.hash(randomBytes(32).toString("base64url"), BCRYPT_COST);

/** Any earlier link of the person stops working (a new one is about to be sent). */
export async function withdrawInvitations(trx: Knex.Transaction, { userId }: { userId: number }) {
  await expireOpenInvitationsByUserId(trx, { userId });
}

/** A one-time link token for the user; only its SHA-256 is stored, so the database never holds a usable link. */
export async function createInvitation(
  trx: Knex.Transaction,
  { userId, actorId }: { userId: number; actorId: number },
): Promise<string> {
  const token = randomBytes(32).toString("base64url");
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 24 * 3600 * 1000);
  const id = await insertInvitation(trx, { userId, tokenSha256: digest(token), expiresAt, createdBy: actorId });
  await recordAudit(trx, {
    actorUserId: actorId,
    entity: "user_invitation",
    entityId: id,
    action: "create",
    after: { userId, expiresAt: expiresAt.toISOString() },
  });
  return token;
}

const invalid = () =>
  new AppError(
    404,
    "invitation_invalid",
    "This invitation link is not valid any more (used, expired or mistyped). Ask the audit team to invite you again.",
  );

/** The person an unused, unexpired invitation is for; null otherwise. */
export async function getInvitationByToken(db: Knex, { token }: { token: string }) {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
  return getOpenInvitationByTokenSha256(db, { tokenSha256: digest(token) });
}

/** Sets the invited person's password and spends the link (404 when it is not valid). */
export async function acceptInvitation(db: Knex, { token, password }: { token: string; password: string }) {
  const hash = await bcrypt.hash(password, BCRYPT_COST);
  return db.transaction(async (trx) => {
    const invitation = await getInvitationByToken(trx, { token });
    if (!invitation) throw invalid();
    if (!(await spendInvitationById(trx, { invitationId: invitation.id }))) throw invalid();
    await setPasswordHashByUserId(trx, { userId: invitation.userId, passwordHash: hash });
    await recordAudit(trx, {
      actorUserId: invitation.userId,
      entity: "user_invitation",
      entityId: invitation.id,
      action: "accept",
      after: { userId: invitation.userId },
    });
    return { email: invitation.email };
  });
}
