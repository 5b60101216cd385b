import "server-only";
import type { Knex } from "knex";
import { CLIENT_ROLE, hasAtLeastRole, type EngagementRole, type MembershipRole } from "@/lib/auth/roles";
import { recordAudit } from "./audit-log";
import { AppError, fieldError, forbidden, notFound } from "@/lib/errors";

export interface MemberRecord {
  userId: number;
  name: string;
  email: string;
  grade: string;
  active: boolean;
  role: EngagementRole;
  addedAt: string;
}

export async function getMembershipRole(
  db: Knex,
  { engagementId, userId }: { engagementId: number; userId: number },
): Promise<MembershipRole | null> {
  const row = await db("engagement_members").where({ engagement_id: engagementId, user_id: userId }).first("role");
  return row ? row.role : null;
}

/** The audit team; client contacts are listed apart (lib/requests/contacts.ts). */
export async function listMembersByEngagementId(
  db: Knex,
  { engagementId }: { engagementId: number },
): Promise<MemberRecord[]> {
  const rows = await db("engagement_members as m")
    .join("users as u", "u.id", "m.user_id")
    .where("m.engagement_id", engagementId)
    .whereNot("m.role", CLIENT_ROLE)
    .orderByRaw("field(m.role, 'partner','manager','senior','staff','viewer'), u.name")
    .select("u.id as userId", "u.name", "u.email", "u.grade", "u.active", "m.role", "m.added_at as addedAt");
  return rows.map((r) => ({
    ...r,
    userId: Number(r.userId),
    active: Boolean(r.active),
    addedAt: new Date(r.addedAt).toISOString(),
  }));
}

/** Name and e-mail of the active members holding one of the roles: whom a notice goes to. */
export async function listActiveMemberContactsByEngagementId(
  db: Knex | Knex.Transaction,
  { engagementId, roles }: { engagementId: number; roles: MembershipRole[] },
): Promise<{ name: string; email: string }[]> {
  return db("engagement_members as m")
    .join("users as u", "u.id", "m.user_id")
    .where({ "m.engagement_id": engagementId, "u.active": true })
    .whereIn("m.role", roles)
    .select("u.name", "u.email");
}

export interface ClientContact {
  userId: number;
  name: string;
  email: string;
  active: boolean;
  invitationPending: boolean;
}

/** The engagement's client contacts, with whether they have yet to choose a password. */
export async function listClientContactsByEngagementId(
  db: Knex | Knex.Transaction,
  { engagementId }: { engagementId: number },
): Promise<ClientContact[]> {
  const rows = await db("engagement_members as m")
    .join("users as u", "u.id", "m.user_id")
    .where({ "m.engagement_id": engagementId, "m.role": CLIENT_ROLE })
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

/** Adds a client contact to the engagement (no audit row: the caller records it in its transaction). */
export async function insertClientMember(
  trx: Knex.Transaction,
  { engagementId, userId }: { engagementId: number; userId: number },
) {
  await trx("engagement_members").insert({ engagement_id: engagementId, user_id: userId, role: CLIENT_ROLE });
}

interface MemberChange {
  engagementId: number;
  actorId: number;
  actorRole: EngagementRole;
  userId: number;
}

function assertMayGrant(actorRole: EngagementRole, role: MembershipRole) {
  if (role === CLIENT_ROLE) throw clientOnTeam();
  if (!hasAtLeastRole(actorRole, role)) throw forbidden(`A ${actorRole} cannot give the ${role} role`);
}

const clientOnTeam = () =>
  fieldError(
    "userId",
    "client staff are not part of the audit team; invite them as a client contact from a sample's client requests",
    "Client staff join as client contacts, from a sample's client requests",
  );

/** Keeps at least one manager or partner on every engagement, so someone can always review and lock. */
async function assertReviewerRemains(trx: Knex.Transaction, engagementId: number, exceptUserId: number) {
  const row = await trx("engagement_members")
    .where({ engagement_id: engagementId })
    .whereIn("role", ["manager", "partner"])
    .whereNot({ user_id: exceptUserId })
    .count({ n: "*" })
    .first();
  if (Number(row?.n ?? 0) === 0)
    throw new AppError(409, "last_reviewer", "An engagement needs at least one manager or partner");
}

/** Adds a member; `inTransaction` runs before the commit (the invitation is queued there, so it commits with the addition). */
export async function addMember(
  db: Knex,
  {
    engagementId,
    actorId,
    actorRole,
    userId,
    role,
    firmId,
    inTransaction,
  }: MemberChange & {
    role: EngagementRole;
    firmId: number;
    inTransaction?: (trx: Knex.Transaction) => Promise<unknown>;
  },
) {
  assertMayGrant(actorRole, role);
  return db.transaction(async (trx) => {
    const user = await trx("users").where({ id: userId, firm_id: firmId, active: true }).first("id", "grade");
    if (!user)
      throw fieldError(
        "userId",
        "no active user with that id in your firm",
        "No active user with that id in your firm",
      );
    if (user.grade === "client") throw clientOnTeam();
    const existing = await trx("engagement_members")
      .where({ engagement_id: engagementId, user_id: userId })
      .first("role");
    if (existing) throw new AppError(409, "already_member", "That person is already on the team");
    await trx("engagement_members").insert({ engagement_id: engagementId, user_id: userId, role });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "engagement_member",
      entityId: `${engagementId}:${userId}`,
      action: "add",
      after: { userId, role },
    });
    await inTransaction?.(trx);
  });
}

export async function changeMemberRole(
  db: Knex,
  { engagementId, actorId, actorRole, userId, role }: MemberChange & { role: EngagementRole },
) {
  assertMayGrant(actorRole, role);
  return db.transaction(async (trx) => {
    const existing = await trx("engagement_members as m")
      .join("users as u", "u.id", "m.user_id")
      .where({ "m.engagement_id": engagementId, "m.user_id": userId })
      .forUpdate()
      .first("m.role", "u.grade");
    if (!existing) throw notFound("That person is not on the team");
    assertMayGrant(actorRole, existing.role);
    if (existing.role === CLIENT_ROLE || existing.grade === "client") throw clientOnTeam();
    if (!hasAtLeastRole(role, "manager")) await assertReviewerRemains(trx, engagementId, userId);
    await trx("engagement_members").where({ engagement_id: engagementId, user_id: userId }).update({ role });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "engagement_member",
      entityId: `${engagementId}:${userId}`,
      action: "change-role",
      before: { role: existing.role },
      after: { role },
    });
  });
}

export async function removeMember(db: Knex, { engagementId, actorId, actorRole, userId }: MemberChange) {
  return db.transaction(async (trx) => {
    const existing = await trx("engagement_members")
      .where({ engagement_id: engagementId, user_id: userId })
      .forUpdate()
      .first("role");
    if (!existing) throw notFound("That person is not on the team");
    if (existing.role !== CLIENT_ROLE) assertMayGrant(actorRole, existing.role);
    await assertReviewerRemains(trx, engagementId, userId);
    await trx("engagement_members").where({ engagement_id: engagementId, user_id: userId }).delete();
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "engagement_member",
      entityId: `${engagementId}:${userId}`,
      action: "remove",
      before: { userId, role: existing.role },
    });
  });
}
