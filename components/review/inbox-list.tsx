import Link from "next/link";
import type { Inbox, InboxReason } from "@/lib/review/inbox";
import { Card, EmptyState } from "@/components/ui/card";
import { Badge } from "@/components/ui/badge";
import { formatDateTime } from "@/lib/format/dates";
import { countOf } from "@/lib/format/numbers";

export const INBOX_REASON_LABELS: Record<InboxReason, string> = {
  review: "Review and sign off",
  lock: "Reviewed — lock it",
  answer: "Answer review notes",
  clear: "Clear answered notes",
};
const TONE = { review: "amber", lock: "green", answer: "red", clear: "blue" } as const;

function what(reason: InboxReason, notes: number) {
  if (reason === "answer") return `${countOf(notes, "open note")} to answer`;
  if (reason === "clear") return `${countOf(notes, "answered note")} to clear`;
  return reason === "review" ? "Signed off by the preparer" : "Signed off by the reviewer";
}

export function InboxList({ inbox }: { inbox: Inbox }) {
  if (inbox.entries.length === 0) return <EmptyState title="Nothing is waiting for you">Samples appear here when a preparer signs off for your review, or a review note waits for your answer.</EmptyState>;
  const { counts } = inbox;
  return (
    <Card>
      <p className="mb-3 text-sm text-ink-soft" data-testid="inbox-summary">
        {(["review", "lock", "answer", "clear"] as const).filter((r) => counts[r] > 0).map((r) => `${INBOX_REASON_LABELS[r]}: ${counts[r].toLocaleString("en-US")}`).join(" · ")}
      </p>
      <table className="w-full text-sm" aria-label="Samples waiting for you">
        <thead className="text-left text-xs uppercase tracking-wider text-ink-soft">
          <tr><th scope="col" className="py-2">Sample</th><th scope="col" className="py-2">Engagement</th><th scope="col" className="py-2">Waiting for</th><th scope="col" className="py-2">Since</th></tr>
        </thead>
        <tbody>
          {inbox.entries.map((e) => (
            <tr key={`${e.sampleId}-${e.reason}`} className="border-t border-ink-line/70 align-top">
              <td className="py-2.5 pr-3"><Link className="font-medium link" href={`/engagements/${e.engagementId}/samples/${e.sampleId}`}>{e.sampleName}</Link></td>
              <td className="py-2.5 pr-3">{e.clientName}<span className="block text-xs text-ink-soft">{e.engagementName}</span></td>
              <td className="py-2.5 pr-3"><Badge tone={TONE[e.reason]}>{INBOX_REASON_LABELS[e.reason]}</Badge><span className="mt-0.5 block text-xs text-ink-soft">{what(e.reason, e.notes)}</span></td>
              <td className="figures py-2.5 text-xs text-ink-soft">{formatDateTime(e.since)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </Card>
  );
}
