import type { Metadata } from "next";
import Link from "next/link";
import { requireClientPageUser } from "@/lib/auth/page-guards";
import { loadClientRequestListPage } from "@/lib/views/request-pages";
import { ClientRequestList } from "@/components/requests/client-request-list";

export const metadata: Metadata = { title: "Request list" };

export default async function ClientRequestPage({ params }: { params: Promise<{ listId: string }> }) {
  const { listId } = await params;
  const user = await requireClientPageUser();
  const view = await loadClientRequestListPage(user.id, listId);
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
