import "server-only";
import type { Knex } from "knex";

/** Failed sign-ins allowed in the window before we refuse further tries (common practice: NIST SP 800-63B §5.2.2 asks for a limit of at most 100). */
export const SIGN_IN_LIMITS = { perAccount: 5, perIp: 20, windowMinutes: 15 } as const;

export type SignInBlock = { scope: "account" | "ip"; retryAfterMinutes: number } | null;

export async function checkSignInAllowed(db: Knex, { email, ip }: { email: string; ip: string }): Promise<SignInBlock> {
  const since = new Date(Date.now() - SIGN_IN_LIMITS.windowMinutes * 60_000);
  const [byAccount, byIp] = await Promise.all([
    db("sign_in_attempts")
      .where({ email, succeeded: false })
      .andWhere("at", ">=", since)
      .count({ n: "*" })
      .min({ first: "at" })
      .first(),
    db("sign_in_attempts")
      .where({ ip, succeeded: false })
      .andWhere("at", ">=", since)
      .count({ n: "*" })
      .min({ first: "at" })
      .first(),
  ]);
  const retry = (first: unknown) =>
    Math.max(
      1,
      Math.ceil((new Date(first as string).getTime() + SIGN_IN_LIMITS.windowMinutes * 60_000 - Date.now()) / 60_000),
    );
  if (Number(byAccount?.n ?? 0) >= SIGN_IN_LIMITS.perAccount)
    return { scope: "account", retryAfterMinutes: retry(byAccount?.first) };
  if (Number(byIp?.n ?? 0) >= SIGN_IN_LIMITS.perIp) return { scope: "ip", retryAfterMinutes: retry(byIp?.first) };
  return null;
}

export async function recordSignInAttempt(
  db: Knex,
  a: { email: string; ip: string; succeeded: boolean; reason?: string },
) {
  await db("sign_in_attempts").insert({ email: a.email, ip: a.ip, succeeded: a.succeeded, reason: a.reason ?? null });
}
