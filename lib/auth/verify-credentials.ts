import "server-only";
import bcrypt from "bcryptjs";
import type { Knex } from "knex";
import { getUserCredentialsByEmail, type UserRecord } from "@/lib/data/users";
import { checkSignInAllowed, recordSignInAttempt } from "./rate-limit";
import { SignInSchema } from "@/lib/validation/user";

export class SignInError extends Error {}

/** Checks an e-mail and password: rate limit first, then the account, then the hash. Every try is logged. */
export async function verifyCredentials(db: Knex, raw: unknown, ip: string): Promise<UserRecord> {
  const parsed = SignInSchema.safeParse(raw);
  if (!parsed.success) throw new SignInError("Enter your e-mail address and password.");
  const { email, password } = parsed.data;

  const block = await checkSignInAllowed(db, { email, ip });
  if (block) {
    await recordSignInAttempt(db, { email, ip, succeeded: false, reason: `blocked-${block.scope}` });
    const who = block.scope === "account" ? "this account" : "this network address";
    throw new SignInError(
      `Too many failed sign-ins for ${who}. Try again in ${block.retryAfterMinutes} minute${block.retryAfterMinutes === 1 ? "" : "s"}.`,
    );
  }

  const found = await getUserCredentialsByEmail(db, { email });
  const ok = found ? await bcrypt.compare(password, found.passwordHash) : false;
  if (!found || !ok) {
    await recordSignInAttempt(db, { email, ip, succeeded: false, reason: found ? "bad-password" : "unknown-account" });
    throw new SignInError("That e-mail and password do not match an account.");
  }
  if (!found.user.active) {
    await recordSignInAttempt(db, { email, ip, succeeded: false, reason: "inactive" });
    throw new SignInError("This account has been deactivated. Ask your firm's administrator.");
  }
  await recordSignInAttempt(db, { email, ip, succeeded: true });
  return found.user;
}
