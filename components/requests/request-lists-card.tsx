import Link from "next/link";
import type { RequestListSummary } from "@/lib/data/request-lists";
import { Badge } from "@/components/ui/badge";
import { buttonClass } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { formatDate } from "@/lib/format/date";

/** The sample's request lists to the client, with how far each has come. */
export function RequestListsCard({
  base,
  lists,
  mayCreate,
}: {
  base: string;
  lists: RequestListSummary[];
  mayCreate: boolean;
}) {
  return (
    <Card
      title="Client requests"
      action={
        mayCreate ? (
          <Link href={`${base}/requests/new`} className={buttonClass("secondary", "px-2.5 py-1 text-xs")}>
            Ask the client for evidence
          </Link>
        ) : undefined
      }
    >
      {lists.length === 0 ? (
        <p className="text-sm text-ink-soft">
          No request list yet. A senior or above can ask the client&rsquo;s staff for the documents behind the selected
          items.
        </p>
      ) : (
        <ul className="divide-y divide-ink-line text-sm" aria-label="Request lists">
          {lists.map((l) => (
            <li key={l.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
              <span>
                <Link href={`${base}/requests/${l.id}`} className="font-medium text-ledger-700 link">
                  {l.title}
                </Link>
                <span className="block text-xs text-ink-faint">
                  to {l.contactName} · due {formatDate(l.dueDate)}
                </span>
              </span>
              <span className="figures flex items-center gap-2 text-xs text-ink-soft">
                {l.counts.accepted}/{l.total} accepted · {l.counts.provided} to review · {l.counts["needs-more"]} sent
                back
                {l.status === "closed" ? <Badge>Closed</Badge> : <Badge tone="blue">Open</Badge>}
              </span>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
