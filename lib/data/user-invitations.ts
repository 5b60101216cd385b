import "server-only";
import type { Knex } from "knex";

// One-time links to choose a password: only the token's SHA-256 is stored.

/** Any open link of the person stops working now. */
export async function expireOpenInvitationsByUserId(trx: Knex.Transaction, { userId }: { userId: number }) {
  await trx("user_invitations")
    .where({ user_id: userId })
    .whereNull("used_at")
    .where("expires_at", ">", trx.fn.now(3))
    .update({ expires_at: trx.fn.now(3) });
}

export async function insertInvitation(
  trx: Knex.Transaction,
  a: { userId: number; tokenSha256: string; expiresAt: Date; createdBy: number },
): Promise<number> {
  const [id] = await trx("user_invitations").insert({
    user_id: a.userId,
    token_sha256: a.tokenSha256,
    expires_at: a.expiresAt,
    created_by: a.createdBy,
  });
  return Number(id);
}

/** The unused, unexpired invitation with this token digest, for an active person; null otherwise. */
export async function getOpenInvitationByTokenSha256(
  db: Knex | Knex.Transaction,
  { tokenSha256 }: { tokenSha256: string },
) {
  const row = await db("user_invitations as i")
    .join("users as u", "u.id", "i.user_id")
    .where("i.token_sha256", tokenSha256)
    .whereNull("i.used_at")
    .where("i.expires_at", ">", db.fn.now(3))
    .where("u.active", true)
    .first("i.id", "u.id as user_id", "u.name", "u.email", "u.grade");
  return row
    ? {
        id: Number(row.id),
        userId: Number(row.user_id),
        name: String(row.name),
        email: String(row.email),
        grade: String(row.grade),
      }
    : null;
}

/** Marks the invitation used; false when it already was (someone else spent it first). */
export async function spendInvitationById(trx: Knex.Transaction, { invitationId }: { invitationId: number }) {
  const spent = await trx("user_invitations")
    .where({ id: invitationId })
    .whereNull("used_at")
    .update({ used_at: trx.fn.now(3) });
  return spent > 0;
}
