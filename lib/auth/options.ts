import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { getDb } from "@/db/knex";
import { verifyCredentials } from "./verify-credentials";
import { clientAddress } from "./client-address";
import { isDatabaseUnavailable } from "@/lib/errors";

export const SESSION_MAX_AGE_SECONDS = 8 * 60 * 60; // one working day

/** True when the user's sessions issued at `issuedAtSeconds` (the JWT's iat) were ended by a password reset. */
export async function sessionEnded(userId: number, issuedAtSeconds: number): Promise<boolean> {
  if (!Number.isFinite(userId) || !Number.isFinite(issuedAtSeconds)) return true;
  const row = await getDb()("users")
    .where({ id: userId })
    .first<{ sessions_valid_after: Date | string | null } | undefined>("sessions_valid_after");
  const validAfter = row?.sessions_valid_after ? new Date(row.sessions_valid_after).getTime() : null;
  return validAfter !== null && issuedAtSeconds * 1000 < Math.floor(validAfter / 1000) * 1000;
}

/**
 * sessionEnded, or "unavailable" while the database cannot answer (a Galera writer failing over, a
 * restart): a blip must neither sign the person out (next-auth clears the cookie when a callback
 * throws) nor let an ended session through — getSessionUserId answers 503 instead.
 */
export async function sessionState(
  userId: number,
  issuedAtSeconds: number,
): Promise<"valid" | "ended" | "unavailable"> {
  try {
    return (await sessionEnded(userId, issuedAtSeconds)) ? "ended" : "valid";
  } catch (err) {
    if (isDatabaseUnavailable(err)) return "unavailable";
    throw err;
  }
}

export const authOptions: NextAuthOptions = {
  session: { strategy: "jwt", maxAge: SESSION_MAX_AGE_SECONDS },
  // Session cookies are always httpOnly and SameSite=Lax, and Secure (__Secure- prefixed) when served over https.
  useSecureCookies: (process.env.NEXTAUTH_URL ?? "").startsWith("https://"),
  pages: { signIn: "/sign-in" },
  providers: [
    CredentialsProvider({
      name: "Sondage account",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(credentials, req) {
        const user = await verifyCredentials(getDb(), credentials, clientAddress(req?.headers));
        return { id: String(user.id), name: user.name, email: user.email };
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) token.uid = Number(user.id);
      // An ended session must not come back when its token is re-issued (with a fresh iat): drop the user from it.
      else if (token.uid !== undefined && (await sessionState(Number(token.uid), Number(token.iat))) === "ended")
        delete token.uid;
      return token;
    },
    async session({ session, token }) {
      // A session issued before the person's password was reset carries no user: they sign in again.
      const state = await sessionState(Number(token.uid), Number(token.iat));
      if (session.user && state === "valid") (session.user as { id?: number }).id = token.uid as number;
      if (state === "unavailable") (session as { databaseUnavailable?: boolean }).databaseUnavailable = true;
      return session;
    },
  },
};
