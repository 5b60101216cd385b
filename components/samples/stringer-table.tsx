import type { MethodEvaluation } from "@/lib/samples/evaluate";
import { Amount } from "@/components/ui/amount";
import { formatFactor } from "./labels";

type Mus = Extract<MethodEvaluation, { kind: "mus" }>;
type Direction = "overstatement" | "understatement";

const num = (v: number) => <Amount value={v.toFixed(2)} />;

/** One direction's Stringer bound, line by line: basic precision, each ranked tainting, the top stratum, the limit. */
function StringerSide({ mus, direction }: { mus: Mus; direction: Direction }) {
  const side = mus.result[direction];
  const rows = mus.rows[direction];
  const J = mus.interval;
  const rf0 = side.basicPrecision / J;
  const projectedFromRows = rows.reduce((s, r) => s + r.projection, 0);
  const topStratum = side.projected - projectedFromRows;
  const net = mus.result.netUpperLimits[direction];
  const label = direction === "overstatement" ? "Overstatement" : "Understatement";
  return (
    <table className="w-full text-sm" aria-label={`Stringer bound — ${direction}`} data-testid={`stringer-${direction}`}>
      <caption className="mb-1 text-left text-sm font-semibold">{label}</caption>
      <thead className="text-left text-xs uppercase tracking-wider text-ink-soft">
        <tr>
          <th scope="col" className="py-1.5 pr-2 font-semibold">Line</th>
          <th scope="col" className="py-1.5 pr-2 text-right font-semibold">Tainting</th>
          <th scope="col" className="py-1.5 pr-2 text-right font-semibold">Factor</th>
          <th scope="col" className="py-1.5 pr-2 text-right font-semibold">Increment − 1</th>
          <th scope="col" className="py-1.5 pr-2 text-right font-semibold">Projected</th>
          <th scope="col" className="py-1.5 text-right font-semibold">Allowance</th>
        </tr>
      </thead>
      <tbody className="figures">
        <tr className="border-t border-ink-line/60">
          <th scope="row" className="py-1.5 pr-2 text-left font-sans font-medium">Basic precision</th>
          <td className="py-1.5 pr-2 text-right">1.0000</td>
          <td className="py-1.5 pr-2 text-right">{formatFactor(rf0)}</td>
          <td className="py-1.5 pr-2 text-right text-ink-faint">—</td>
          <td className="py-1.5 pr-2 text-right text-ink-faint">—</td>
          <td className="py-1.5 text-right" data-testid={`basic-precision-${direction}`}>{num(side.basicPrecision)}</td>
        </tr>
        {rows.map((r) => (
          <tr key={r.rank} className="border-t border-ink-line/60">
            <th scope="row" className="py-1.5 pr-2 text-left font-sans font-normal">Rank {r.rank}</th>
            <td className="py-1.5 pr-2 text-right">{formatFactor(r.tainting)}</td>
            <td className="py-1.5 pr-2 text-right">{formatFactor(r.factor)}</td>
            <td className="py-1.5 pr-2 text-right">{formatFactor(r.factorIncrement)}</td>
            <td className="py-1.5 pr-2 text-right">{num(r.projection)}</td>
            <td className="py-1.5 text-right">{num(r.incrementalAllowance)}</td>
          </tr>
        ))}
        {Math.abs(topStratum) >= 0.005 && (
          <tr className="border-t border-ink-line/60">
            <th scope="row" className="py-1.5 pr-2 text-left font-sans font-normal">Top stratum (actual)</th>
            <td colSpan={3} className="py-1.5 pr-2 text-right font-sans text-xs text-ink-faint">taken at its amount, no allowance</td>
            <td className="py-1.5 pr-2 text-right">{num(topStratum)}</td>
            <td className="py-1.5 text-right text-ink-faint">—</td>
          </tr>
        )}
        <tr className="border-t-2 border-ink-line font-semibold">
          <th scope="row" colSpan={4} className="py-1.5 pr-2 text-left font-sans">Totals</th>
          <td className="py-1.5 pr-2 text-right" data-testid={`projected-${direction}`}>{num(side.projected)}</td>
          <td className="py-1.5 text-right">{num(side.basicPrecision + side.incrementalAllowance)}</td>
        </tr>
        <tr className="bg-paper-sunk/60 font-semibold">
          <th scope="row" colSpan={5} className="py-2 pl-2 pr-2 text-left font-sans">Upper misstatement limit (basic precision + projected + incremental allowance)</th>
          <td className="py-2 pr-2 text-right" data-testid={`upper-limit-${direction}`}>{num(side.upperLimit)}</td>
        </tr>
        <tr className="text-ink-soft">
          <th scope="row" colSpan={5} className="py-1.5 pr-2 text-left font-sans font-normal">Net of projected {direction === "overstatement" ? "understatement" : "overstatement"}</th>
          <td className="py-1.5 text-right">{num(net)}</td>
        </tr>
      </tbody>
    </table>
  );
}

export function StringerTables({ mus, direction }: { mus: Mus; direction: "overstatement" | "understatement" | "both" }) {
  const sides: Direction[] = direction === "both" ? ["overstatement", "understatement"] : [direction];
  return (
    <div className="space-y-5">
      <p className="text-xs text-ink-soft">
        Sampling interval J = <Amount value={mus.interval.toFixed(2)} />; Poisson factors: {mus.factorMode === "exact" ? "exact gamma quantiles" : "table values (rounded up to 2 decimals)"}; {mus.topStratumItems} top-stratum item{mus.topStratumItems === 1 ? "" : "s"} with a result.
        Most likely misstatement (over − under): <span className="font-semibold text-ink" data-testid="most-likely"><Amount value={mus.result.mostLikelyMisstatement.toFixed(2)} /></span>.
      </p>
      <div className={`grid gap-6 ${sides.length === 2 ? "xl:grid-cols-2" : ""}`}>
        {sides.map((d) => <StringerSide key={d} mus={mus} direction={d} />)}
      </div>
    </div>
  );
}
