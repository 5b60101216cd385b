import "server-only";
import type { Knex } from "knex";
import { getFailedSignInsByEmail, getFailedSignInsByIp, insertSignInAttempt } from "@/lib/data/sign-in-attempts";

/** Failed sign-ins allowed in the window before we refuse further tries (common practice: NIST SP 800-63B §5.2.2 asks for a limit of at most 100). */
export const SIGN_IN_LIMITS = { perAccount: 5, perIp: 20, windowMinutes: 15 } as const;

export type SignInBlock = { scope: "account" | "ip"; retryAfterMinutes: number } | null;

export async function checkSignInAllowed(db: Knex, { email, ip }: { email: string; ip: string }): Promise<SignInBlock> {
  const since = new Date(Date.now() - SIGN_IN_LIMITS.windowMinutes * 60_000);
  const [byAccount, byIp] = await Promise.all([
    getFailedSignInsByEmail(db, { email, since }),
    getFailedSignInsByIp(db, { ip, since }),
  ]);
  const retry = (first: Date | null) =>
    Math.max(1, Math.ceil(((first?.getTime() ?? NaN) + SIGN_IN_LIMITS.windowMinutes * 60_000 - Date.now()) / 60_000));
  if (byAccount.count >= SIGN_IN_LIMITS.perAccount)
    return { scope: "account", retryAfterMinutes: retry(byAccount.firstAt) };
  if (byIp.count >= SIGN_IN_LIMITS.perIp) return { scope: "ip", retryAfterMinutes: retry(byIp.firstAt) };
  return null;
}

export async function recordSignInAttempt(
  db: Knex,
  a: { email: string; ip: string; succeeded: boolean; reason?: string },
) {
  await insertSignInAttempt(db, a);
}
