import type { Metadata } from "next";
import Link from "next/link";
import { getDb } from "@/db/knex";
import { requireEngagementPage } from "@/lib/auth/page-guards";
import { getSampleById } from "@/lib/data/samples";
import { listMembersByEngagementId } from "@/lib/data/members";
import { listSampleAuditTrail } from "@/lib/review/audit-trail";
import { AuditQuerySchema } from "@/lib/validation/review";
import { PageHeader } from "@/components/ui/page-header";
import { Card, EmptyState } from "@/components/ui/card";
import { Alert } from "@/components/ui/alert";
import { AuditValue } from "@/components/review/audit-value";

export const metadata: Metadata = { title: "Audit trail" };

const KIND_LABELS = { all: "Everything", plan: "Plan", selection: "Selection", results: "Results", evidence: "Evidence", review: "Review", lock: "Lock" } as const;

export default async function TrailPage({ params, searchParams }: { params: Promise<{ engagementId: string; sampleId: string }>; searchParams: Promise<Record<string, string | undefined>> }) {
  const [{ engagementId, sampleId }, sp] = await Promise.all([params, searchParams]);
  const { engagement, role } = await requireEngagementPage(engagementId);
  if (role === "viewer") return <Alert>The audit trail is open to the audit team (staff and above).</Alert>;
  const db = getDb();
  const sample = await getSampleById(db, { engagementId: engagement.id, sampleId: Number(sampleId) });
  const query = AuditQuerySchema.parse({ userId: sp.userId || undefined, kind: sp.kind || undefined });
  const [entries, members] = await Promise.all([listSampleAuditTrail(db, { sampleId: sample.id, query }), listMembersByEngagementId(db, { engagementId: engagement.id })]);
  return (
    <>
      <PageHeader eyebrow={engagement.clientName} title={`Audit trail — ${sample.name}`}>
        <Link href={`/engagements/${engagement.id}/samples/${sample.id}`} className="link">Back to the sample</Link> · every change, who made it and when, with the values before and after.
      </PageHeader>
      <form className="mb-4 flex flex-wrap items-end gap-3 text-sm" method="get">
        <label>
          <span className="mb-1 block font-medium">Person</span>
          <select name="userId" defaultValue={sp.userId ?? ""} className="rounded-md border border-ink-line bg-paper-raised px-2 py-1.5">
            <option value="">Everyone</option>
            {members.map((m) => <option key={m.userId} value={m.userId}>{m.name}</option>)}
          </select>
        </label>
        <label>
          <span className="mb-1 block font-medium">Kind of change</span>
          <select name="kind" defaultValue={query.kind} className="rounded-md border border-ink-line bg-paper-raised px-2 py-1.5">
            {Object.entries(KIND_LABELS).map(([k, v]) => <option key={k} value={k}>{v}</option>)}
          </select>
        </label>
        <button type="submit" className="rounded-md border border-ink-line bg-paper-raised px-3 py-1.5 font-medium hover:bg-paper-sunk">Filter</button>
      </form>
      <Card>
        {entries.length === 0 ? <EmptyState title="No changes match this filter" /> : (
          <table className="w-full text-sm" aria-label="Audit trail">
            <thead className="text-left text-xs uppercase tracking-wider text-ink-soft">
              <tr><th className="py-2">When (UTC)</th><th>Who</th><th>What</th><th>Before</th><th>After</th></tr>
            </thead>
            <tbody>
              {entries.map((e) => (
                <tr key={e.id} className="border-t border-ink-line/70 align-top">
                  <td className="figures whitespace-nowrap py-2 pr-3 text-xs">{e.at.replace("T", " ").slice(0, 19)}</td>
                  <td className="pr-3">{e.actorName ?? "system"}</td>
                  <td className="pr-3"><span className="font-medium">{e.action}</span><span className="block text-xs text-ink-faint">{e.entity} {e.entityId}</span></td>
                  <td className="pr-3"><AuditValue value={e.before} /></td>
                  <td><AuditValue value={e.after} /></td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Card>
    </>
  );
}
