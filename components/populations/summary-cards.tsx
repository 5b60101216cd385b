import type { PopulationRecord } from "@/lib/data/populations";
import { Amount } from "@/components/ui/amount";
import { formatCount } from "@/lib/format/number";

function Figure({
  title,
  count,
  total,
  currency,
  tone,
}: {
  title: string;
  count: number;
  total?: string;
  currency: string;
  tone: string;
}) {
  return (
    <div className={`rounded-card border border-ink-line bg-paper-raised px-4 py-3 shadow-card border-l-4 ${tone}`}>
      <p className="text-xs font-semibold uppercase tracking-wider text-ink-soft">{title}</p>
      <p className="figures mt-1 text-xl font-semibold text-ink">
        {formatCount(count)} <span className="text-sm font-normal text-ink-soft">{count === 1 ? "item" : "items"}</span>
      </p>
      {total !== undefined && (
        <p className="mt-0.5 text-sm">
          <Amount value={total} currency={currency} />
        </p>
      )}
    </div>
  );
}

/** Count and total, then the three sign groups that sampling treats apart. */
export function SummaryCards({ population: p, currency }: { population: PopulationRecord; currency: string }) {
  return (
    <section aria-label="Population summary" className="space-y-2">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <Figure title="All items" count={p.rowCount} total={p.total} currency={currency} tone="border-l-ink" />
        <Figure
          title="Positive (debits)"
          count={p.positive.count}
          total={p.positive.total}
          currency={currency}
          tone="border-l-ledger-500"
        />
        <Figure title="Zero" count={p.zero.count} total="0.00" currency={currency} tone="border-l-slate-500" />
        <Figure
          title="Negative (credits)"
          count={p.negative.count}
          total={p.negative.total}
          currency={currency}
          tone="border-l-brick-500"
        />
      </div>
      <p className="text-xs text-ink-soft">
        Zero and negative items form separate populations: monetary-unit sampling selects only from the positive items,
        so test credits and zero balances on their own if they matter to the assertion.
      </p>
    </section>
  );
}
