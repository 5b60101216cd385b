import bcrypt from "bcryptjs";
import { getDb } from "@/db/knex";
import type { Grade, MembershipRole } from "@/lib/auth/roles";

import { randomUUID } from "node:crypto";

let counter = 0;
const run = randomUUID().slice(0, 8); // test files share the database but not this module
const hash = bcrypt.hashSync("integration-pass-1", 4);

export async function makeFirm() {
  const [id] = await getDb()("firms").insert({ name: `Test firm ${++counter}` });
  return id;
}

export async function makeUser(firmId: number, grade: Grade, opts: { admin?: boolean; active?: boolean } = {}) {
  const n = ++counter;
  const [id] = await getDb()("users").insert({
    firm_id: firmId,
    email: `u${n}-${run}-${grade}@test.example`,
    name: `Person ${n} (${grade})`,
    grade,
    firm_role: opts.admin ? "admin" : "member",
    active: opts.active ?? true,
    password_hash: hash,
  });
  return id;
}

export async function makeEngagement(firmId: number, createdBy: number, team: [number, MembershipRole][]) {
  const db = getDb();
  const [id] = await db("engagements").insert({
    firm_id: firmId,
    client_name: `Client ${++counter}`,
    name: "Audit",
    period_end: "2026-12-31",
    currency: "USD",
    overall_materiality: "100000.00",
    performance_materiality: "75000.00",
    created_by: createdBy,
  });
  for (const [userId, role] of team)
    await db("engagement_members").insert({ engagement_id: id, user_id: userId, role });
  return id;
}

export async function auditCount(filter: Record<string, string | number> = {}) {
  const row = await getDb()("audit_log").where(filter).count({ n: "*" }).first();
  return Number(row?.n ?? 0);
}

/** audit_log JSON as an object (mysql2 may hand it back parsed or as text). */
export function json(value: unknown): unknown {
  return typeof value === "string" ? JSON.parse(value) : value;
}
