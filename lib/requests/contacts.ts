import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { getMembershipRole, insertClientMember } from "@/lib/data/members";
import { insertClientUser, lockUserByEmail } from "@/lib/data/users";
import { AppError } from "@/lib/errors";
import type { z } from "zod";
import type { InviteClientContactSchema } from "@/lib/validation/requests";
import { createInvitation, unusablePasswordHash } from "./invitations";

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
    const existing = await lockUserByEmail(trx, { email: input.email });
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
      if (await getMembershipRole(trx, { engagementId, userId }))
        throw new AppError(409, "already_member", `${existing.name} is already a client contact of this engagement`);
    } else {
      userId = await insertClientUser(trx, {
        firmId,
        email: input.email,
        name: input.name,
        passwordHash: unusable,
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
    await insertClientMember(trx, { engagementId, userId });
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
