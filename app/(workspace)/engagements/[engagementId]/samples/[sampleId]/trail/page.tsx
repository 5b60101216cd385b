import type { Metadata } from "next";
import Link from "next/link";
import { requireEngagementPage } from "@/lib/auth/page-guards";
import { loadTrailPage } from "@/lib/views/sample-page";
import { AuditQuerySchema } from "@/lib/validation/review";
import { PageHeader } from "@/components/ui/page-header";
import { Card, EmptyState } from "@/components/ui/card";
import { Alert } from "@/components/ui/alert";
import { ChangeList } from "@/components/review/audit-value";
import { describeChange } from "@/lib/review/describe-change";
import { formatDateTime } from "@/lib/format/date";
import { Table, THead, Th, Td } from "@/components/ui/table";

export const metadata: Metadata = { title: "Audit trail" };

const KIND_LABELS = {
  all: "Everything",
  plan: "Plan",
  selection: "Selection",
  results: "Results",
  evidence: "Evidence",
  review: "Review",
  lock: "Lock",
} as const;

export default async function TrailPage({
  params,
  searchParams,
}: {
  params: Promise<{ engagementId: string; sampleId: string }>;
  searchParams: Promise<Record<string, string | undefined>>;
}) {
  const [{ engagementId, sampleId }, sp] = await Promise.all([params, searchParams]);
  const { engagement, role } = await requireEngagementPage(engagementId);
  if (role === "viewer") return <Alert>The audit trail is open to the audit team (staff and above).</Alert>;
  const query = AuditQuerySchema.parse({ userId: sp.userId || undefined, kind: sp.kind || undefined });
  const { sample, entries, members, context } = await loadTrailPage(engagement.id, sampleId, query);
  return (
    <>
      <PageHeader eyebrow={engagement.clientName} title={`Audit trail — ${sample.name}`}>
        <Link href={`/engagements/${engagement.id}/samples/${sample.id}`} className="link">
          Back to the sample
        </Link>{" "}
        · every change, who made it and when, with the values before and after.
      </PageHeader>
      <form className="mb-4 flex flex-wrap items-end gap-3 text-sm" method="get">
        <label>
          <span className="mb-1 block font-medium">Person</span>
          <select
            name="userId"
            defaultValue={sp.userId ?? ""}
            className="rounded-md border border-ink-line bg-paper-raised px-2 py-1.5"
          >
            <option value="">Everyone</option>
            {members.map((m) => (
              <option key={m.userId} value={m.userId}>
                {m.name}
              </option>
            ))}
          </select>
        </label>
        <label>
          <span className="mb-1 block font-medium">Kind of change</span>
          <select
            name="kind"
            defaultValue={query.kind}
            className="rounded-md border border-ink-line bg-paper-raised px-2 py-1.5"
          >
            {Object.entries(KIND_LABELS).map(([k, v]) => (
              <option key={k} value={k}>
                {v}
              </option>
            ))}
          </select>
        </label>
        <button
          type="submit"
          className="rounded-md border border-ink-line bg-paper-raised px-3 py-1.5 font-medium hover:bg-paper-sunk"
        >
          Filter
        </button>
      </form>
      <Card>
        {entries.length === 0 ? (
          <EmptyState title="No changes match this filter" />
        ) : (
          <Table label="Audit trail" density="list" className="table-fixed">
            <colgroup>
              <col className="w-48" />
              <col className="w-40" />
              <col className="w-64" />
              <col />
            </colgroup>
            <THead>
              <tr>
                <Th>When</Th>
                <Th>Who</Th>
                <Th>What</Th>
                <Th>Change (before → after)</Th>
              </tr>
            </THead>
            <tbody>
              {entries.map((e) => {
                const r = describeChange(e, context);
                return (
                  <tr key={e.id} className="border-t border-ink-line/70 align-top">
                    <Td className="text-xs">{formatDateTime(e.at)}</Td>
                    <Td>{e.actorName ?? "Sondage"}</Td>
                    <Td>
                      <span className="font-medium">{r.what}</span>
                      {r.subject && <span className="block text-xs text-ink-soft">{r.subject}</span>}
                    </Td>
                    <Td>
                      <ChangeList changes={r.changes} />
                    </Td>
                  </tr>
                );
              })}
            </tbody>
          </Table>
        )}
      </Card>
    </>
  );
}
