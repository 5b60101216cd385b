import "server-only";
import { notFound } from "next/navigation";
import { requirePageUser } from "./page-guards";

/** For admin pages: firm administrators only; everyone else sees not-found. */
export async function requireAdminPage() {
  const user = await requirePageUser();
  if (user.firmRole !== "admin") notFound();
  return user;
}
