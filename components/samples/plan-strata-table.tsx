import type { PlannedStratum } from "@/lib/samples/plan";
import { Amount } from "@/components/ui/amount";
import { formatCount } from "@/lib/format/number";

/** Neyman allocation of the sample across book-value bands, as planned. */
export function PlanStrataTable({ strata }: { strata: PlannedStratum[] }) {
  const total = strata.reduce((n, s) => n + s.allocation, 0);
  return (
    <table className="w-full text-sm" aria-label="Allocation by stratum">
      <caption className="mb-1 text-left text-xs font-semibold uppercase tracking-wider text-ink-soft">Neyman allocation by stratum</caption>
      <thead className="text-left text-xs text-ink-soft">
        <tr>
          <th scope="col" className="py-1 pr-2 font-medium">Band</th>
          <th scope="col" className="py-1 pr-2 text-right font-medium">N<sub>h</sub></th>
          <th scope="col" className="py-1 pr-2 text-right font-medium">Book value</th>
          <th scope="col" className="py-1 pr-2 text-right font-medium">S<sub>h</sub></th>
          <th scope="col" className="py-1 text-right font-medium">n<sub>h</sub></th>
        </tr>
      </thead>
      <tbody>
        {strata.map((s) => (
          <tr key={s.number} className="border-t border-ink-line/60">
            <td className="py-1.5 pr-2">{s.number}. {s.label}</td>
            <td className="figures py-1.5 pr-2 text-right">{formatCount(s.populationSize)}</td>
            <td className="py-1.5 pr-2 text-right"><Amount value={s.bookValue} /></td>
            <td className="py-1.5 pr-2 text-right"><Amount value={s.standardDeviation.toFixed(2)} /></td>
            <td className="figures py-1.5 text-right font-semibold">{formatCount(s.allocation)}</td>
          </tr>
        ))}
        <tr className="border-t border-ink-line font-semibold"><td className="py-1.5" colSpan={4}>Total</td><td className="figures py-1.5 text-right">{formatCount(total)}</td></tr>
      </tbody>
    </table>
  );
}
