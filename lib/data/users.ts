import "server-only";
import type { Knex } from "knex";
import type { FirmRole, Grade, MembershipRole } from "@/lib/auth/roles";
import type { CreateUser, UpdateUser } from "@/lib/validation/user";
import { recordAudit } from "./audit-log";
import { AppError, notFound } from "@/lib/errors";
import type { UsersRow } from "./tables";

export interface UserRecord {
  id: number;
  firmId: number;
  email: string;
  name: string;
  firmRole: FirmRole;
  grade: Grade;
  active: boolean;
  createdAt: string;
}

const columns = ["id", "firm_id", "email", "name", "firm_role", "grade", "active", "created_at"] as const;

function toUser(r: Pick<UsersRow, (typeof columns)[number]>): UserRecord {
  return {
    id: Number(r.id),
    firmId: Number(r.firm_id),
    email: String(r.email),
    name: String(r.name),
    firmRole: r.firm_role,
    grade: r.grade,
    active: Boolean(r.active),
    createdAt: new Date(r.created_at).toISOString(),
  };
}

export const BCRYPT_COST = 10;

export async function getUserById(db: Knex, { userId }: { userId: number }): Promise<UserRecord | null> {
  const row = await db("users")
    .where({ id: userId })
    .first(...columns);
  return row ? toUser(row) : null;
}

/**
 * The user and their role on one engagement (null when not on its team), in one query: every
 * engagement route reads both before anything else.
 */
export async function getUserWithMembershipRole(
  db: Knex,
  { userId, engagementId }: { userId: number; engagementId: number },
): Promise<{ user: UserRecord | null; membershipRole: MembershipRole | null }> {
  const row = await db("users as u")
    .leftJoin("engagement_members as m", (j) => {
      j.on("m.user_id", "=", "u.id").andOn("m.engagement_id", "=", db.raw("?", [engagementId]));
    })
    .where("u.id", userId)
    .first(...columns.map((c) => `u.${c}`), "m.role as membership_role");
  if (!row) return { user: null, membershipRole: null };
  return { user: toUser(row), membershipRole: (row.membership_role as MembershipRole | null) ?? null };
}

/** The user and their hash, for sign-in only. */
export async function getUserCredentialsByEmail(db: Knex, { email }: { email: string }) {
  const row = await db("users")
    .where({ email: email.toLowerCase() })
    .first(...columns, "password_hash");
  return row ? { user: toUser(row), passwordHash: String(row.password_hash) } : null;
}

/** The firm of the account with this e-mail, or null when no one has an account under it (mail to outsiders). */
export async function getFirmIdByUserEmail(db: Knex | Knex.Transaction, { email }: { email: string }) {
  const row = await db("users").where({ email }).first("firm_id");
  return row ? Number(row.firm_id) : null;
}

/** The person's new password (chosen with a one-time link). */
export async function setPasswordHashByUserId(
  trx: Knex.Transaction,
  { userId, passwordHash }: { userId: number; passwordHash: string },
) {
  await trx("users")
    .where({ id: userId })
    .update({ password_hash: passwordHash, updated_at: trx.fn.now(3) });
}

/** The account under this e-mail, under a row lock to the end of the transaction; undefined when none. */
export async function lockUserByEmail(trx: Knex.Transaction, { email }: { email: string }) {
  return trx("users").where({ email }).forUpdate().first("id", "firm_id", "grade", "active", "name");
}

/** A new client contact's account: grade "client", no usable password until they choose one with their link. */
export async function insertClientUser(
  trx: Knex.Transaction,
  { firmId, email, name, passwordHash }: { firmId: number; email: string; name: string; passwordHash: string },
): Promise<number> {
  const [id] = await trx("users").insert({
    firm_id: firmId,
    email,
    name,
    grade: "client",
    firm_role: "member",
    password_hash: passwordHash,
  });
  return Number(id);
}

export async function listUsersByFirmId(
  db: Knex,
  { firmId, activeOnly = false }: { firmId: number; activeOnly?: boolean },
) {
  const q = db("users").where({ firm_id: firmId }).orderBy("name");
  if (activeOnly) q.andWhere({ active: true });
  return (await q.select(...columns)).map(toUser);
}

/** A new person of the firm, inside the caller's transaction; the hash is of a password nobody knows until they choose theirs with an invitation. */
export async function createUser(
  trx: Knex.Transaction,
  {
    firmId,
    actorId,
    input,
    passwordHash,
  }: { firmId: number; actorId: number; input: CreateUser; passwordHash: string },
) {
  const taken = await trx("users").where({ email: input.email }).first("id");
  if (taken)
    throw new AppError(409, "email_taken", `A user with e-mail ${input.email} already exists`, {
      email: ["Already in use"],
    });
  const [id] = await trx("users").insert({
    firm_id: firmId,
    email: input.email,
    name: input.name,
    grade: input.grade,
    firm_role: input.firmRole,
    password_hash: passwordHash,
  });
  const after = { email: input.email, name: input.name, grade: input.grade, firmRole: input.firmRole, active: true };
  await recordAudit(trx, { actorUserId: actorId, entity: "user", entityId: id, action: "create", after });
  return (await getUserById(trx, { userId: id }))!;
}

export async function updateUser(
  db: Knex,
  { firmId, actorId, userId, input }: { firmId: number; actorId: number; userId: number; input: UpdateUser },
) {
  return db.transaction(async (trx) => {
    const before = await trx("users")
      .where({ id: userId, firm_id: firmId })
      .forUpdate()
      .first(...columns);
    if (!before) throw notFound("No such user");
    if (userId === actorId && (input.active === false || input.firmRole === "member"))
      throw new AppError(409, "self_lockout", "You cannot deactivate yourself or remove your own admin role");
    const patch: Record<string, unknown> = { updated_at: trx.fn.now(3) };
    if (input.active !== undefined) patch.active = input.active;
    if (input.grade) patch.grade = input.grade;
    if (input.firmRole) patch.firm_role = input.firmRole;
    if (input.name) patch.name = input.name;
    await trx("users").where({ id: userId }).update(patch);
    const after = (await getUserById(trx, { userId }))!;
    const { createdAt: _c, ...beforeView } = toUser(before);
    const { createdAt: _d, ...afterView } = after;
    await recordAudit(trx, {
      actorUserId: actorId,
      entity: "user",
      entityId: userId,
      action: "update",
      before: beforeView,
      after: afterView,
    });
    return after;
  });
}

/**
 * Inside the caller's transaction: the person's password stops working (replaced by one nobody knows)
 * and every session they have open ends (sessions issued before this instant are refused, lib/auth/options.ts).
 */
export async function revokePassword(
  trx: Knex.Transaction,
  { firmId, actorId, userId, passwordHash }: { firmId: number; actorId: number; userId: number; passwordHash: string },
) {
  const updated = await trx("users")
    .where({ id: userId, firm_id: firmId })
    .update({ password_hash: passwordHash, sessions_valid_after: trx.fn.now(3), updated_at: trx.fn.now(3) });
  if (!updated) throw notFound("No such user");
  await recordAudit(trx, {
    actorUserId: actorId,
    entity: "user",
    entityId: userId,
    action: "reset-password",
    after: { openSessions: "ended", newPassword: "chosen by the person with a one-time link" },
  });
  return (await getUserById(trx, { userId }))!;
}
