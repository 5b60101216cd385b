import { redirect } from "next/navigation";
import { requirePageUser } from "@/lib/auth/page-guards";

/** Each person's start page: firm administrators their people, client contacts their request lists, auditors their engagements. */
export default async function Home() {
  const user = await requirePageUser();
  if (user.grade === "client") redirect("/requests");
  redirect(user.firmRole === "admin" ? "/admin/users" : "/engagements");
}
