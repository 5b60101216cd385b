import "server-only";
import type { Knex } from "knex";

/** Failed sign-ins since a time: how many, and when the first of them was (null when none). */
export interface FailedSignIns {
  count: number;
  firstAt: Date | null;
}

async function failedSince(
  db: Knex | Knex.Transaction,
  where: { email: string } | { ip: string },
  since: Date,
): Promise<FailedSignIns> {
  const row = await db("sign_in_attempts")
    .where({ ...where, succeeded: false })
    .andWhere("at", ">=", since)
    .count({ n: "*" })
    .min({ first: "at" })
    .first();
  const first: unknown = row?.first;
  return {
    count: Number(row?.n ?? 0),
    firstAt: first instanceof Date ? first : typeof first === "string" ? new Date(first) : null,
  };
}

export function getFailedSignInsByEmail(db: Knex | Knex.Transaction, { email, since }: { email: string; since: Date }) {
  return failedSince(db, { email }, since);
}

export function getFailedSignInsByIp(db: Knex | Knex.Transaction, { ip, since }: { ip: string; since: Date }) {
  return failedSince(db, { ip }, since);
}

export async function insertSignInAttempt(
  db: Knex | Knex.Transaction,
  a: { email: string; ip: string; succeeded: boolean; reason?: string },
): Promise<void> {
  await db("sign_in_attempts").insert({ email: a.email, ip: a.ip, succeeded: a.succeeded, reason: a.reason ?? null });
}
