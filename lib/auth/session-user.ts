import "server-only";
import { getServerSession } from "next-auth";
import { databaseUnavailable } from "@/lib/errors";
import { authOptions } from "./options";

/**
 * The signed-in user's id from the next-auth session, or null. The only place that reads the session.
 * Throws 503 database_unavailable when the session could not be checked against the database.
 */
export async function getSessionUserId(): Promise<number | null> {
  const session = await getServerSession(authOptions);
  if ((session as { databaseUnavailable?: boolean } | null)?.databaseUnavailable) throw databaseUnavailable();
  const id = (session?.user as { id?: number } | undefined)?.id;
  return typeof id === "number" && Number.isInteger(id) ? id : null;
}
