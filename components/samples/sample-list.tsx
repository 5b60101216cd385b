import Link from "next/link";
import type { SampleRecord } from "@/lib/data/samples";
import { Badge } from "@/components/ui/badge";
import { EmptyState } from "@/components/ui/card";
import { formatCount, METHOD_SHORT, SAMPLE_STATUS_LABELS } from "./labels";

/** The engagement's samples for its overview card: name, method, size, state. */
export function SampleList({ engagementId, samples, mayPlan }: { engagementId: number; samples: SampleRecord[]; mayPlan: boolean }) {
  if (samples.length === 0) {
    return (
      <EmptyState title="No samples yet">
        {mayPlan ? "Plan a sample from a reconciled population; it is drawn on the server from a recorded seed." : "A senior on the team plans and draws the samples; they will be listed here."}
      </EmptyState>
    );
  }
  return (
    <table className="w-full text-sm" aria-label="Samples">
      <thead className="text-left text-xs uppercase tracking-wider text-ink-soft">
        <tr>
          <th scope="col" className="py-2 pr-4 font-semibold">Sample</th>
          <th scope="col" className="py-2 pr-4 font-semibold">Method</th>
          <th scope="col" className="py-2 pr-4 text-right font-semibold">Items</th>
          <th scope="col" className="py-2 pr-4 font-semibold">Status</th>
          <th scope="col" className="py-2 font-semibold"><span className="sr-only">Open</span></th>
        </tr>
      </thead>
      <tbody>
        {samples.map((s) => (
          <tr key={s.id} className="border-t border-ink-line/70">
            <td className="py-2.5 pr-4">
              <Link href={`/engagements/${engagementId}/samples/${s.id}`} className="font-medium text-ink hover:text-ledger-600 link">{s.name}</Link>
              <span className="block text-xs text-ink-faint">{s.assertion} · planned by {s.createdByName}</span>
            </td>
            <td className="py-2.5 pr-4">{METHOD_SHORT[s.method]}</td>
            <td className="figures py-2.5 pr-4 text-right">{formatCount(s.chosenSize)}</td>
            <td className="py-2.5 pr-4"><Badge tone={s.status === "drawn" ? "green" : "blue"}>{SAMPLE_STATUS_LABELS[s.status]}</Badge></td>
            <td className="py-2.5 text-right"><Link href={`/engagements/${engagementId}/samples/${s.id}`} className="text-sm font-medium text-ledger-600 link">Open</Link></td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
