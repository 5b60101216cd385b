import type { MusEvaluationBlock, StringerSide as Side } from "@/lib/samples/evaluation-types";
import { Amount } from "@/components/ui/amount";
import { formatFactor, formatPercent } from "@/lib/format/number";
import { Table, THead, Th, Td } from "@/components/ui/table";

type Direction = "overstatement" | "understatement";

/** One direction's Stringer bound, line by line, as the evaluation view model gives it. */
function StringerSide({ side, direction, net }: { side: Side; direction: Direction; net: string }) {
  const label = direction === "overstatement" ? "Overstatement" : "Understatement";
  return (
    <Table label={`Stringer bound — ${direction}`} density="compact" data-testid={`stringer-${direction}`}>
      <caption className="mb-1 text-left text-sm font-semibold">{label}</caption>
      <THead>
        <tr>
          <Th>Line</Th>
          <Th numeric>Book / audited</Th>
          <Th numeric>Tainting</Th>
          <Th numeric>RF(k)</Th>
          <Th numeric>RF(k) − RF(k−1)</Th>
          <Th numeric>Projected t·J</Th>
          <Th numeric>Allowance</Th>
        </tr>
      </THead>
      <tbody className="figures">
        <tr className="border-t border-ink-line/60">
          <Th scope="row" className="font-sans font-medium">
            Basic precision
          </Th>
          <Td className="text-right text-ink-faint">—</Td>
          <Td className="text-right">1.0000</Td>
          <Td className="text-right">{formatFactor(side.basicPrecisionFactor)}</Td>
          <Td className="text-right text-ink-faint">—</Td>
          <Td className="text-right text-ink-faint">—</Td>
          <Td data-testid={`basic-precision-${direction}`} className="text-right">
            <Amount value={side.basicPrecision} />
          </Td>
        </tr>
        {side.rows.map((r) => (
          <tr key={r.rank} className="border-t border-ink-line/60">
            <Th scope="row" className="font-sans font-normal">
              Rank {r.rank} · {r.reference}
            </Th>
            <Td className="text-right">
              <Amount value={r.bookValue} /> / <Amount value={r.auditedValue} />
            </Td>
            <Td className="text-right">{formatPercent(r.tainting, 2)}</Td>
            <Td className="text-right">{formatFactor(r.factor)}</Td>
            <Td className="text-right">{formatFactor(r.factorIncrement)}</Td>
            <Td className="text-right">
              <Amount value={r.projected} />
            </Td>
            <Td className="text-right">
              <Amount value={r.incrementalAllowance} />
            </Td>
          </tr>
        ))}
        <tr className="border-t border-ink-line/60">
          <Th scope="row" colSpan={5} className="font-sans font-normal">
            Projected from the sample (Σ t·J)
          </Th>
          <Td className="text-right">
            <Amount value={side.projectedFromSample} />
          </Td>
          <Td className="text-right text-ink-faint">—</Td>
        </tr>
        <tr className="border-t border-ink-line/60">
          <Th scope="row" colSpan={5} className="font-sans font-normal">
            Top stratum, at its actual amount (no allowance)
          </Th>
          <Td className="text-right">
            <Amount value={side.topStratumMisstatement} />
          </Td>
          <Td className="text-right text-ink-faint">—</Td>
        </tr>
        <tr className="border-t-2 border-ink-line font-semibold">
          <Th scope="row" colSpan={5} className="font-sans">
            Projected misstatement · incremental allowance Σ (RF(k) − RF(k−1) − 1)·t·J
          </Th>
          <Td data-testid={`projected-${direction}`} className="text-right">
            <Amount value={side.projected} />
          </Td>
          <Td className="text-right">
            <Amount value={side.incrementalAllowance} />
          </Td>
        </tr>
        <tr className="bg-paper-sunk/60 font-semibold">
          <Th scope="row" colSpan={6} className="font-sans">
            Upper misstatement limit, gross (basic precision + projected + incremental allowance)
          </Th>
          <Td data-testid={`upper-limit-${direction}`} className="text-right">
            <Amount value={side.upperLimit} />
          </Td>
        </tr>
        <tr className="text-ink-soft">
          <Th scope="row" colSpan={6} className="font-sans font-normal">
            Net of projected {direction === "overstatement" ? "understatement" : "overstatement"}
          </Th>
          <Td data-testid={`net-limit-${direction}`} className="text-right">
            <Amount value={net} />
          </Td>
        </tr>
      </tbody>
    </Table>
  );
}

/** The Stringer bound of a monetary-unit sample, each direction on its own, with the gross/net convention named. */
export function StringerTables({ mus }: { mus: MusEvaluationBlock }) {
  return (
    <div className="space-y-5">
      <p className="text-xs text-ink-soft">
        Sampling interval J = <Amount value={mus.interval} />; reliability factors:{" "}
        {mus.factorMode === "exact" ? "exact Poisson (gamma quantile)" : "table values (rounded up to 2 decimals)"};{" "}
        {mus.sampleItems} item{mus.sampleItems === 1 ? "" : "s"} below the interval; top stratum {mus.topStratum.count}{" "}
        item{mus.topStratum.count === 1 ? "" : "s"}, book <Amount value={mus.topStratum.bookValue} />, audited{" "}
        <Amount value={mus.topStratum.auditedValue} />. Most likely misstatement (over − under):{" "}
        <span className="font-semibold text-ink" data-testid="most-likely">
          <Amount value={mus.mostLikelyMisstatement} />
        </span>
        .
      </p>
      <p className="text-sm" data-testid="mus-limits-statement">
        <span className="font-semibold">{mus.limits === "gross" ? "Gross limits" : "Net limits"} (firm setting):</span>{" "}
        {mus.statement}
      </p>
      <div className="grid gap-6 xl:grid-cols-2">
        <StringerSide side={mus.overstatement} direction="overstatement" net={mus.netUpperLimits.overstatement} />
        <StringerSide side={mus.understatement} direction="understatement" net={mus.netUpperLimits.understatement} />
      </div>
      {mus.understatementCaution && (
        <p
          className="rounded border border-amber-300 bg-amber-50 p-2 text-sm text-amber-900"
          data-testid="mus-understatement-caution"
        >
          ⚠ {mus.understatementCaution}
        </p>
      )}
    </div>
  );
}
