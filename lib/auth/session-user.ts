import "server-only";
import { getServerSession } from "next-auth";
import { authOptions } from "./options";

/** The signed-in user's id from the next-auth session, or null. The only place that reads the session. */
export async function getSessionUserId(): Promise<number | null> {
  const session = await getServerSession(authOptions);
  const id = (session?.user as { id?: number } | undefined)?.id;
  return typeof id === "number" && Number.isInteger(id) ? id : null;
}
