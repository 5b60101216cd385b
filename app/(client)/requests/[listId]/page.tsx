import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { getDb } from "@/db/knex";
import { requireClientPageUser } from "@/lib/auth/page-guards";
import { getContactRequestListById } from "@/lib/data/request-lists";
import { clientListView } from "@/lib/requests/views";
import { ClientRequestList } from "@/components/requests/client-request-list";

export const metadata: Metadata = { title: "Request list" };

export default async function ClientRequestPage({ params }: { params: Promise<{ listId: string }> }) {
  const { listId } = await params;
  const user = await requireClientPageUser();
  const id = Number(listId);
  if (!Number.isSafeInteger(id) || id <= 0) notFound();
  const db = getDb();
  const list = await getContactRequestListById(db, { listId: id, contactUserId: user.id });
  if (!list) notFound();
  const view = await clientListView(db, list);
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href="/requests" className="text-ink-soft link">
          ← My requests
        </Link>
      </p>
      <ClientRequestList initial={view} />
    </>
  );
}
