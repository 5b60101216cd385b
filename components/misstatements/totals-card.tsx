import type { SummaryView } from "@/lib/misstatements/types";
import { Amount } from "@/components/ui/amount";
import { Card } from "@/components/ui/card";
import { Table, THead, Th, Td } from "@/components/ui/table";

function Line({ label, value, strong }: { label: string; value: string; strong?: boolean }) {
  return (
    <div
      className={`flex items-baseline justify-between gap-4 border-b border-ink-line/60 py-1.5 text-sm ${strong ? "font-semibold" : ""}`}
    >
      <dt className={strong ? "" : "text-ink-soft"}>{label}</dt>
      <dd className="text-right">
        <Amount value={value} />
      </dd>
    </div>
  );
}

/** Totals against overall and performance materiality, both prior-period approaches side by side, and the allowances. */
export function TotalsCard({ view }: { view: SummaryView }) {
  const { totals: t, materiality: m } = view;
  const is = t.incomeStatementApproach,
    bs = t.balanceSheetApproach;
  const both: [string, string, string, boolean?][] = [
    ["Uncorrected, current year", t.uncorrected.currentYear, t.uncorrected.currentYear],
    ["Prior-period effect", is.priorPeriod, bs.priorPeriod],
    ["Total uncorrected", is.total, bs.total, true],
    ["Margin to performance materiality", is.marginToPerformance, bs.marginToPerformance],
    ["Margin to overall materiality", is.marginToOverall, bs.marginToOverall],
  ];
  return (
    <Card title={`Totals (${m.currency})`}>
      <div className="grid gap-6 lg:grid-cols-2">
        <dl>
          <Line label="Overall materiality" value={m.overall} />
          <Line label="Performance materiality" value={m.performance} />
          <Line label="Clearly trivial threshold" value={m.clearlyTrivial} />
          <Line label="Uncorrected factual" value={t.uncorrected.factual} />
          <Line label="Uncorrected judgemental" value={t.uncorrected.judgemental} />
          <Line label="Uncorrected projected" value={t.uncorrected.projected} />
          <Line label="Uncorrected, current year" value={t.uncorrected.currentYear} strong />
          <Line label="Gross, without offsetting" value={t.uncorrected.gross} />
          <Line label={`Corrected by the client (${t.corrected.count}, not accumulated)`} value={t.corrected.total} />
          <Line label={`Clearly trivial (${t.clearlyTrivial.count}, listed only)`} value={t.clearlyTrivial.total} />
        </dl>
        <div className="space-y-4">
          <Table density="compact">
            <caption className="mb-2 text-left text-sm font-semibold">
              Prior-period misstatements: two approaches, never mixed
            </caption>
            <THead>
              <tr className="border-b border-ink-line text-xs uppercase tracking-wider text-ink-soft">
                <Th className="font-medium">
                  <span className="sr-only">Figure</span>
                </Th>
                <Th numeric className="font-medium">
                  Income statement (rollover)
                </Th>
                <Th numeric className="font-medium">
                  Balance sheet (iron curtain)
                </Th>
              </tr>
            </THead>
            <tbody>
              {both.map(([label, a, b, strong]) => (
                <tr key={label} className={`border-b border-ink-line/60 ${strong ? "font-semibold" : ""}`}>
                  <Th scope="row" className={`py-1.5 text-left ${strong ? "" : "font-normal text-ink-soft"}`}>
                    {label}
                  </Th>
                  <Td className="text-right">
                    <Amount value={a} />
                  </Td>
                  <Td className="text-right">
                    <Amount value={b} />
                  </Td>
                </tr>
              ))}
            </tbody>
          </Table>
          <dl>
            <Line
              label={`Sum of sampling allowances (${t.allowance.samples} sample${t.allowance.samples === 1 ? "" : "s"}, conservative)`}
              value={t.allowance.sum}
            />
            <Line label="Larger total + allowances" value={t.upperEstimate} />
          </dl>
          <p className="text-xs text-ink-soft">{t.allowance.note}</p>
        </div>
      </div>
    </Card>
  );
}
