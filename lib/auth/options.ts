import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { getDb } from "@/db/knex";
import { verifyCredentials } from "./verify-credentials";
import { clientAddress } from "./client-address";

export const SESSION_MAX_AGE_SECONDS = 8 * 60 * 60; // one working day

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
    jwt({ token, user }) {
      if (user) token.uid = Number(user.id);
      return token;
    },
    session({ session, token }) {
      if (session.user) (session.user as { id?: number }).id = token.uid as number;
      return session;
    },
  },
};
