import Link from "next/link";
import type { Inbox, InboxReason } from "@/lib/review/inbox";
import { Card, EmptyState } from "@/components/ui/card";
import { Badge } from "@/components/ui/badge";
import { formatDateTime } from "@/lib/format/date";
import { countOf } from "@/lib/format/number";
import { Table, THead, Th, Td } from "@/components/ui/table";

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
  if (inbox.entries.length === 0)
    return (
      <EmptyState title="Nothing is waiting for you">
        Samples appear here when a preparer signs off for your review, or a review note waits for your answer.
      </EmptyState>
    );
  const { counts } = inbox;
  return (
    <Card>
      <p className="mb-3 text-sm text-ink-soft" data-testid="inbox-summary">
        {(["review", "lock", "answer", "clear"] as const)
          .filter((r) => counts[r] > 0)
          .map((r) => `${INBOX_REASON_LABELS[r]}: ${counts[r].toLocaleString("en-US")}`)
          .join(" · ")}
      </p>
      <Table label="Samples waiting for you" density="list">
        <THead>
          <tr>
            <Th>Sample</Th>
            <Th>Engagement</Th>
            <Th>Waiting for</Th>
            <Th>Since</Th>
          </tr>
        </THead>
        <tbody>
          {inbox.entries.map((e) => (
            <tr key={`${e.sampleId}-${e.reason}`} className="border-t border-ink-line/70 align-top">
              <Td>
                <Link className="font-medium link" href={`/engagements/${e.engagementId}/samples/${e.sampleId}`}>
                  {e.sampleName}
                </Link>
              </Td>
              <Td>
                {e.clientName}
                <span className="block text-xs text-ink-soft">{e.engagementName}</span>
              </Td>
              <Td>
                <Badge tone={TONE[e.reason]}>{INBOX_REASON_LABELS[e.reason]}</Badge>
                <span className="mt-0.5 block text-xs text-ink-soft">{what(e.reason, e.notes)}</span>
              </Td>
              <Td className="figures text-xs text-ink-soft">{formatDateTime(e.since)}</Td>
            </tr>
          ))}
        </tbody>
      </Table>
    </Card>
  );
}
