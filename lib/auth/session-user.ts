import "server-only";
import { cookies } from "next/headers";
import { getToken } from "next-auth/jwt";
import { databaseUnavailable } from "@/lib/errors";
import { authOptions, sessionState } from "./options";

type TokenRequest = Parameters<typeof getToken>[0]["req"];

/**
 * The signed-in user's id from the next-auth session cookie, or null. The only place that reads the session.
 * It decodes the session token (as next-auth's own session route does) and checks it against a password
 * reset with one query; `getServerSession` would run next-auth's whole session action instead — both
 * callbacks, each reading the database, and a re-encrypted token that a route handler throws away —
 * which cost about a third of a grid page's time under load (`npm run bench:load`).
 * Throws 503 database_unavailable when the session could not be checked against the database.
 */
export async function getSessionUserId(): Promise<number | null> {
  const jar = await cookies();
  const token = await getToken({
    req: { headers: {}, cookies: Object.fromEntries(jar.getAll().map((c) => [c.name, c.value])) } as TokenRequest,
    secureCookie: Boolean(authOptions.useSecureCookies),
    secret: process.env.NEXTAUTH_SECRET,
  });
  const id = Number(token?.uid);
  if (!token || !Number.isInteger(id)) return null;
  const state = await sessionState(id, Number(token.iat));
  if (state === "unavailable") throw databaseUnavailable();
  return state === "valid" ? id : null;
}
