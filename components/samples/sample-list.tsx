import Link from "next/link";
import type { SampleRecord } from "@/lib/data/samples";
import type { SampleOverview } from "@/lib/samples/overview";
import { Badge } from "@/components/ui/badge";
import { EmptyState } from "@/components/ui/card";
import { formatAmount } from "@/components/ui/amount";
import { countOf } from "@/lib/format/numbers";
import { formatCount, METHOD_SHORT, SAMPLE_STATUS_LABELS } from "./labels";

function Result({ o }: { o: SampleOverview | undefined }) {
  if (!o || o.items === null) return <span className="text-ink-soft">—</span>;
  if (o.withResult === 0) return <span className="text-ink-soft">no results yet</span>;
  const figure = o.attribute ? countOf(o.deviations, "deviation") : o.projectedMisstatement === null ? null : `projected ${formatAmount(o.projectedMisstatement)}`;
  const bound = o.bound ? ` · ${o.bound.label} ${formatAmount(o.bound.amount)}` : "";
  return (
    <span>
      <span className="figures">{figure ?? "—"}{bound}</span>
      <span className="block text-xs">
        {!o.complete ? <span className="text-ink-soft">provisional</span>
          : o.supported === true ? <span className="text-ledger-700">supports the recorded amount</span>
            : o.supported === false ? <span className="font-medium text-brick-700">does not support it</span> : null}
      </span>
    </span>
  );
}

/** The engagement's samples: name, method, distinct items, progress, the result so far, state. */
export function SampleList({ engagementId, samples, overviews = {}, mayPlan }: { engagementId: number; samples: SampleRecord[]; overviews?: Record<number, SampleOverview>; mayPlan: boolean }) {
  if (samples.length === 0) {
    return (
      <EmptyState title="No samples yet">
        {mayPlan ? "Plan a sample from a reconciled population; it is drawn on the server from a recorded seed." : "A senior on the team plans and draws the samples; they will be listed here."}
      </EmptyState>
    );
  }
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm" aria-label="Samples">
        <thead className="text-left text-xs uppercase tracking-wider text-ink-soft">
          <tr>
            <th scope="col" className="py-2 pr-4 font-semibold">Sample</th>
            <th scope="col" className="py-2 pr-4 font-semibold">Method</th>
            <th scope="col" className="py-2 pr-4 text-right font-semibold">Items</th>
            <th scope="col" className="py-2 pr-4 font-semibold">Progress</th>
            <th scope="col" className="py-2 pr-4 font-semibold">Result so far</th>
            <th scope="col" className="py-2 font-semibold">Status</th>
          </tr>
        </thead>
        <tbody>
          {samples.map((s) => {
            const o = overviews[s.id];
            const items = o?.items ?? null;
            return (
              <tr key={s.id} className="border-t border-ink-line/70 align-top" data-testid={`sample-row-${s.id}`}>
                <td className="py-2.5 pr-4">
                  <Link href={`/engagements/${engagementId}/samples/${s.id}`} className="font-medium text-ink hover:text-ledger-600 link">{s.name}</Link>
                  <span className="block text-xs text-ink-soft">{s.assertion} · planned by {s.createdByName}</span>
                </td>
                <td className="py-2.5 pr-4">{METHOD_SHORT[s.method]}</td>
                <td className="figures py-2.5 pr-4 text-right">
                  {items === null ? formatCount(s.chosenSize) : formatCount(items)}
                  {items !== null && items !== s.chosenSize && <span className="block text-xs text-ink-soft">size {formatCount(s.chosenSize)}</span>}
                  {items === null && <span className="block text-xs text-ink-soft">planned</span>}
                </td>
                <td className="py-2.5 pr-4">
                  {items === null ? <span className="text-ink-soft">not drawn</span> : (
                    <span className="inline-flex min-w-28 flex-col gap-1">
                      <span className="figures text-xs">{formatCount(o.withResult)} of {formatCount(items)}</span>
                      <span className="h-1.5 w-full overflow-hidden rounded-full bg-paper-sunk" aria-hidden>
                        <span className="block h-full bg-ledger-600" style={{ width: `${items === 0 ? 0 : Math.round((o.withResult / items) * 100)}%` }} />
                      </span>
                    </span>
                  )}
                </td>
                <td className="py-2.5 pr-4"><Result o={o} /></td>
                <td className="py-2.5"><Badge tone={s.status === "drawn" ? "green" : "blue"}>{SAMPLE_STATUS_LABELS[s.status]}</Badge></td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
