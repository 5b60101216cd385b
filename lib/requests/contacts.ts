import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { AppError } from "@/lib/errors";
import type { z } from "zod";
import type { InviteClientContactSchema } from "@/lib/validation/requests";
import { createInvitation, unusablePasswordHash } from "./invitations";

export interface ClientContact {
  userId: number;
  name: string;
  email: string;
  active: boolean;
  invitationPending: boolean;
}

/** The engagement's client contacts, with whether they have yet to choose a password. */
export async function listClientContactsByEngagementId(
  db: Knex,
  { engagementId }: { engagementId: number },
): Promise<ClientContact[]> {
  const rows = await db("engagement_members as m")
    .join("users as u", "u.id", "m.user_id")
    .where({ "m.engagement_id": engagementId, "m.role": "client" })
    .orderBy("u.name")
    .select(
      "u.id",
      "u.name",
      "u.email",
      "u.active",
      db.raw(
        "exists(select 1 from user_invitations i where i.user_id = u.id and i.used_at is null and i.expires_at > now(3)) as pending",
      ),
    );
  return rows.map((r) => ({
    userId: Number(r.id),
    name: String(r.name),
    email: String(r.email),
    active: Boolean(r.active),
    invitationPending: Boolean(Number(r.pending)),
  }));
}

/** The contact invited, and their one-time link's token when a new account was made. */
export interface InvitedContact {
  userId: number;
  token: string | null;
  name: string;
  email: string;
}

/**
 * Invites a client contact to one engagement (a senior or above on it): a new person gets a user
 * of grade "client" with no usable password and a one-time link to choose one; a client user of
 * the firm who already has an account is simply added. Anyone else with that e-mail is refused (409).
 */
export async function inviteClientContact(
  db: Knex,
  {
    engagementId,
    firmId,
    actorId,
    input,
    inTransaction,
  }: {
    engagementId: number;
    firmId: number;
    actorId: number;
    input: z.output<typeof InviteClientContactSchema>;
    /** Runs before the commit (the invitation is queued there, so it commits with the contact or not at all). */
    inTransaction?: (trx: Knex.Transaction, invited: InvitedContact) => Promise<unknown>;
  },
): Promise<InvitedContact> {
  const unusable = await unusablePasswordHash();
  return db.transaction(async (trx) => {
    const existing = await trx("users")
      .where({ email: input.email })
      .forUpdate()
      .first("id", "firm_id", "grade", "active", "name");
    let userId: number;
    let token: string | null = null;
    if (existing) {
      if (Number(existing.firm_id) !== firmId || existing.grade !== "client" || !existing.active) {
        throw new AppError(
          409,
          "email_taken",
          `email: ${input.email} belongs to a Sondage account that is not an active client contact of your firm`,
          { email: ["Already used by another kind of account"] },
        );
      }
      userId = Number(existing.id);
      const member = await trx("engagement_members")
        .where({ engagement_id: engagementId, user_id: userId })
        .first("role");
      if (member)
        throw new AppError(409, "already_member", `${existing.name} is already a client contact of this engagement`);
    } else {
      [userId] = await trx("users").insert({
        firm_id: firmId,
        email: input.email,
        name: input.name,
        grade: "client",
        firm_role: "member",
        password_hash: unusable,
      });
      await recordAudit(trx, {
        actorUserId: actorId,
        entity: "user",
        entityId: userId,
        action: "create",
        after: {
          email: input.email,
          name: input.name,
          grade: "client",
          firmRole: "member",
          active: true,
          invitedTo: engagementId,
        },
      });
      token = await createInvitation(trx, { userId, actorId });
    }
    await trx("engagement_members").insert({ engagement_id: engagementId, user_id: userId, role: "client" });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "engagement_member",
      entityId: `${engagementId}:${userId}`,
      action: "add",
      after: { userId, role: "client" },
    });
    const invited = { userId, token, name: existing ? String(existing.name) : input.name, email: input.email };
    await inTransaction?.(trx, invited);
    return invited;
  });
}
