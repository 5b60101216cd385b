import Link from "next/link";
import type { SampleRecord } from "@/lib/data/samples";
import type { SampleOverview } from "@/lib/samples/overview";
import { Badge } from "@/components/ui/badge";
import { EmptyState } from "@/components/ui/card";
import { METHOD_SHORT, SAMPLE_STATUS_LABELS } from "./labels";
import { countOf, formatCount, formatMoney } from "@/lib/format/number";
import { Table, THead, Th, Td } from "@/components/ui/table";

function Result({ o }: { o: SampleOverview | undefined }) {
  if (!o || o.items === null) return <span className="text-ink-soft">—</span>;
  if (o.withResult === 0) return <span className="text-ink-soft">no results yet</span>;
  const figure = o.attribute
    ? countOf(o.deviations, "deviation")
    : o.projectedMisstatement === null
      ? null
      : `projected ${formatMoney(o.projectedMisstatement)}`;
  const bound = o.bound ? ` · ${o.bound.label} ${formatMoney(o.bound.amount)}` : "";
  return (
    <span>
      <span className="figures">
        {figure ?? "—"}
        {bound}
      </span>
      <span className="block text-xs">
        {!o.complete ? (
          <span className="text-ink-soft">provisional</span>
        ) : o.supported === true ? (
          <span className="text-ledger-700">supports the recorded amount</span>
        ) : o.supported === false ? (
          <span className="font-medium text-brick-700">does not support it</span>
        ) : null}
      </span>
    </span>
  );
}

/** The engagement's samples: name, method, distinct items, progress, the result so far, state. */
export function SampleList({
  engagementId,
  samples,
  overviews = {},
  mayPlan,
}: {
  engagementId: number;
  samples: SampleRecord[];
  overviews?: Record<number, SampleOverview>;
  mayPlan: boolean;
}) {
  if (samples.length === 0) {
    return (
      <EmptyState title="No samples yet">
        {mayPlan
          ? "Plan a sample from a reconciled population; it is drawn on the server from a recorded seed."
          : "A senior on the team plans and draws the samples; they will be listed here."}
      </EmptyState>
    );
  }
  return (
    <div className="overflow-x-auto">
      <Table label="Samples" density="list">
        <THead>
          <tr>
            <Th>Sample</Th>
            <Th>Method</Th>
            <Th numeric>Items</Th>
            <Th>Progress</Th>
            <Th>Result so far</Th>
            <Th>Status</Th>
          </tr>
        </THead>
        <tbody>
          {samples.map((s) => {
            const o = overviews[s.id];
            const items = o?.items ?? null;
            return (
              <tr key={s.id} className="border-t border-ink-line/70 align-top" data-testid={`sample-row-${s.id}`}>
                <Td>
                  <Link
                    href={`/engagements/${engagementId}/samples/${s.id}`}
                    className="font-medium text-ink hover:text-ledger-600 link"
                  >
                    {s.name}
                  </Link>
                  <span className="block text-xs text-ink-soft">
                    {s.assertion} · planned by {s.createdByName}
                  </span>
                </Td>
                <Td>{METHOD_SHORT[s.method]}</Td>
                <Td numeric>
                  {items === null ? formatCount(s.chosenSize) : formatCount(items)}
                  {items !== null && items !== s.chosenSize && (
                    <span className="block text-xs text-ink-soft">size {formatCount(s.chosenSize)}</span>
                  )}
                  {items === null && <span className="block text-xs text-ink-soft">planned</span>}
                </Td>
                <Td>
                  {items === null ? (
                    <span className="text-ink-soft">not drawn</span>
                  ) : (
                    <span className="inline-flex min-w-28 flex-col gap-1">
                      <span className="figures text-xs">
                        {formatCount(o.withResult)} of {formatCount(items)}
                      </span>
                      <span className="h-1.5 w-full overflow-hidden rounded-full bg-paper-sunk" aria-hidden>
                        <span
                          className="block h-full bg-ledger-600"
                          style={{ width: `${items === 0 ? 0 : Math.round((o.withResult / items) * 100)}%` }}
                        />
                      </span>
                    </span>
                  )}
                </Td>
                <Td>
                  <Result o={o} />
                </Td>
                <Td>
                  <Badge tone={s.status === "drawn" ? "green" : "blue"}>{SAMPLE_STATUS_LABELS[s.status]}</Badge>
                </Td>
              </tr>
            );
          })}
        </tbody>
      </Table>
    </div>
  );
}
