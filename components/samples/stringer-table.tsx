import type { MusEvaluationBlock, StringerSide as Side } from "@/lib/samples/evaluation-types";
import { Amount } from "@/components/ui/amount";
import { formatFactor, formatPercent } from "@/lib/format/number";

type Direction = "overstatement" | "understatement";

/** One direction's Stringer bound, line by line, as the evaluation view model gives it. */
function StringerSide({ side, direction, net }: { side: Side; direction: Direction; net: string }) {
  const label = direction === "overstatement" ? "Overstatement" : "Understatement";
  return (
    <table className="w-full text-sm" aria-label={`Stringer bound — ${direction}`} data-testid={`stringer-${direction}`}>
      <caption className="mb-1 text-left text-sm font-semibold">{label}</caption>
      <thead className="text-left text-xs uppercase tracking-wider text-ink-soft">
        <tr>
          <th scope="col" className="py-1.5 pr-2 font-semibold">Line</th>
          <th scope="col" className="py-1.5 pr-2 text-right font-semibold">Book / audited</th>
          <th scope="col" className="py-1.5 pr-2 text-right font-semibold">Tainting</th>
          <th scope="col" className="py-1.5 pr-2 text-right font-semibold">RF(k)</th>
          <th scope="col" className="py-1.5 pr-2 text-right font-semibold">RF(k) − RF(k−1)</th>
          <th scope="col" className="py-1.5 pr-2 text-right font-semibold">Projected t·J</th>
          <th scope="col" className="py-1.5 text-right font-semibold">Allowance</th>
        </tr>
      </thead>
      <tbody className="figures">
        <tr className="border-t border-ink-line/60">
          <th scope="row" className="py-1.5 pr-2 text-left font-sans font-medium">Basic precision</th>
          <td className="py-1.5 pr-2 text-right text-ink-faint">—</td>
          <td className="py-1.5 pr-2 text-right">1.0000</td>
          <td className="py-1.5 pr-2 text-right">{formatFactor(side.basicPrecisionFactor)}</td>
          <td className="py-1.5 pr-2 text-right text-ink-faint">—</td>
          <td className="py-1.5 pr-2 text-right text-ink-faint">—</td>
          <td className="py-1.5 text-right" data-testid={`basic-precision-${direction}`}><Amount value={side.basicPrecision} /></td>
        </tr>
        {side.rows.map((r) => (
          <tr key={r.rank} className="border-t border-ink-line/60">
            <th scope="row" className="py-1.5 pr-2 text-left font-sans font-normal">Rank {r.rank} · {r.reference}</th>
            <td className="py-1.5 pr-2 text-right"><Amount value={r.bookValue} /> / <Amount value={r.auditedValue} /></td>
            <td className="py-1.5 pr-2 text-right">{formatPercent(r.tainting, 2)}</td>
            <td className="py-1.5 pr-2 text-right">{formatFactor(r.factor)}</td>
            <td className="py-1.5 pr-2 text-right">{formatFactor(r.factorIncrement)}</td>
            <td className="py-1.5 pr-2 text-right"><Amount value={r.projected} /></td>
            <td className="py-1.5 text-right"><Amount value={r.incrementalAllowance} /></td>
          </tr>
        ))}
        <tr className="border-t border-ink-line/60">
          <th scope="row" colSpan={5} className="py-1.5 pr-2 text-left font-sans font-normal">Projected from the sample (Σ t·J)</th>
          <td className="py-1.5 pr-2 text-right"><Amount value={side.projectedFromSample} /></td>
          <td className="py-1.5 text-right text-ink-faint">—</td>
        </tr>
        <tr className="border-t border-ink-line/60">
          <th scope="row" colSpan={5} className="py-1.5 pr-2 text-left font-sans font-normal">Top stratum, at its actual amount (no allowance)</th>
          <td className="py-1.5 pr-2 text-right"><Amount value={side.topStratumMisstatement} /></td>
          <td className="py-1.5 text-right text-ink-faint">—</td>
        </tr>
        <tr className="border-t-2 border-ink-line font-semibold">
          <th scope="row" colSpan={5} className="py-1.5 pr-2 text-left font-sans">Projected misstatement · incremental allowance Σ (RF(k) − RF(k−1) − 1)·t·J</th>
          <td className="py-1.5 pr-2 text-right" data-testid={`projected-${direction}`}><Amount value={side.projected} /></td>
          <td className="py-1.5 text-right"><Amount value={side.incrementalAllowance} /></td>
        </tr>
        <tr className="bg-paper-sunk/60 font-semibold">
          <th scope="row" colSpan={6} className="py-2 pl-2 pr-2 text-left font-sans">Upper misstatement limit, gross (basic precision + projected + incremental allowance)</th>
          <td className="py-2 pr-2 text-right" data-testid={`upper-limit-${direction}`}><Amount value={side.upperLimit} /></td>
        </tr>
        <tr className="text-ink-soft">
          <th scope="row" colSpan={6} className="py-1.5 pr-2 text-left font-sans font-normal">Net of projected {direction === "overstatement" ? "understatement" : "overstatement"}</th>
          <td className="py-1.5 text-right" data-testid={`net-limit-${direction}`}><Amount value={net} /></td>
        </tr>
      </tbody>
    </table>
  );
}

/** The Stringer bound of a monetary-unit sample, each direction on its own, with the gross/net convention named. */
export function StringerTables({ mus }: { mus: MusEvaluationBlock }) {
  return (
    <div className="space-y-5">
      <p className="text-xs text-ink-soft">
        Sampling interval J = <Amount value={mus.interval} />; reliability factors: {mus.factorMode === "exact" ? "exact Poisson (gamma quantile)" : "table values (rounded up to 2 decimals)"}; {mus.sampleItems} item{mus.sampleItems === 1 ? "" : "s"} below the interval; top stratum {mus.topStratum.count} item{mus.topStratum.count === 1 ? "" : "s"}, book <Amount value={mus.topStratum.bookValue} />, audited <Amount value={mus.topStratum.auditedValue} />.
        Most likely misstatement (over − under): <span className="font-semibold text-ink" data-testid="most-likely"><Amount value={mus.mostLikelyMisstatement} /></span>.
      </p>
      <p className="text-sm" data-testid="mus-limits-statement"><span className="font-semibold">{mus.limits === "gross" ? "Gross limits" : "Net limits"} (firm setting):</span> {mus.statement}</p>
      <div className="grid gap-6 xl:grid-cols-2">
        <StringerSide side={mus.overstatement} direction="overstatement" net={mus.netUpperLimits.overstatement} />
        <StringerSide side={mus.understatement} direction="understatement" net={mus.netUpperLimits.understatement} />
      </div>
      {mus.understatementCaution && <p className="rounded border border-amber-300 bg-amber-50 p-2 text-sm text-amber-900" data-testid="mus-understatement-caution">⚠ {mus.understatementCaution}</p>}
    </div>
  );
}
