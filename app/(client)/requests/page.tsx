import type { Metadata } from "next";
import Link from "next/link";
import { requireClientPageUser } from "@/lib/auth/page-guards";
import { loadClientRequestsPage } from "@/lib/views/request-pages";
import { PageHeader } from "@/components/ui/page-header";
import { Badge } from "@/components/ui/badge";
import { EmptyState } from "@/components/ui/card";
import { formatDate } from "@/lib/format/date";

export const metadata: Metadata = { title: "My requests" };

export default async function MyRequestsPage() {
  const user = await requireClientPageUser();
  const lists = await loadClientRequestsPage(user.id);
  const today = new Date().toISOString().slice(0, 10);
  return (
    <>
      <PageHeader title="Documents your auditors asked for">
        Each list names the items the audit team selected and what they need for each. Upload the documents per item;
        you will see when they are accepted or if more is needed.
      </PageHeader>
      {lists.length === 0 ? (
        <EmptyState title="No requests yet">
          When the audit team sends you a request list, it appears here and you get an e-mail.
        </EmptyState>
      ) : (
        <ul className="space-y-3" aria-label="Request lists">
          {lists.map((l) => {
            const waiting = l.counts.requested + l.counts["needs-more"];
            const late = l.status === "open" && l.dueDate < today && waiting > 0;
            return (
              <li key={l.id} className="rounded-card border border-ink-line bg-paper-raised p-4 shadow-card">
                <div className="flex flex-wrap items-baseline justify-between gap-3">
                  <Link href={`/requests/${l.id}`} className="text-base font-semibold text-ledger-700 link">
                    {l.title}
                  </Link>
                  <span className="flex gap-2">
                    {l.status === "closed" ? (
                      <Badge>Closed</Badge>
                    ) : late ? (
                      <Badge tone="red">Overdue</Badge>
                    ) : (
                      <Badge tone="blue">Open</Badge>
                    )}
                  </span>
                </div>
                <p className="mt-1 text-sm text-ink-soft">
                  {l.engagement.clientName} — {l.engagement.name} · from {l.sentBy} · due {formatDate(l.dueDate)}
                </p>
                <p className="figures mt-2 text-sm">
                  {waiting} of {l.total} still to send · {l.counts.provided} with the auditors · {l.counts.accepted}{" "}
                  accepted
                </p>
              </li>
            );
          })}
        </ul>
      )}
    </>
  );
}
