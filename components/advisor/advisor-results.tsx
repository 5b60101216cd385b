import type { AdvisedEstimator } from "@/lib/sampling";
import { ADVISED_ESTIMATOR_LABELS } from "@/lib/sampling/advise";
import type { AdvisorRunRecord } from "@/lib/data/advisor-runs";
import { boundInWords, scenarioInWords } from "@/lib/advisor/describe";
import { Badge } from "@/components/ui/badge";
import { formatCount, formatMoney } from "@/lib/format/number";
import { EstimatorSwatch, EstimateHistogram, SizeChart, compactFigure } from "./advisor-charts";
import { EstimateZoom } from "./estimate-zoom";
import { Table, THead, Th, Td } from "@/components/ui/table";

const pct = (v: number) => `${(v * 100).toFixed(1)}%`;

/** A finished run: the recommendation, the figures at every size, histograms and the size charts. */
export function AdvisorResults({ run, currency }: { run: AdvisorRunRecord; currency: string }) {
  const result = run.result!;
  const rec = result.recommendation;
  const sizes = run.request.sampleSizes;
  const estimators = [...new Set(result.cells.map((c) => c.estimator))] as AdvisedEstimator[];
  const atSize = result.cells.filter((c) => c.sampleSize === rec.sampleSize);
  const from = Math.min(
    ...atSize.flatMap((c) => c.performance.histogram.map((b) => b.from)),
    result.truth.auditedTotal,
  );
  const to = Math.max(...atSize.flatMap((c) => c.performance.histogram.map((b) => b.to)), result.truth.auditedTotal);
  const series = (pick: (c: (typeof result.cells)[number]) => number) =>
    estimators.map((estimator) => ({
      estimator,
      points: result.cells
        .filter((c) => c.estimator === estimator)
        .map((c) => ({ sampleSize: c.sampleSize, value: pick(c) })),
    }));

  return (
    <div className="space-y-5">
      <section
        aria-label="Recommendation"
        className={`rounded-md border px-4 py-3 ${rec.recommended ? "border-ledger-500/40 bg-ledger-50" : "border-amber-500/40 bg-amber-50"}`}
      >
        <p className="font-medium text-ink">
          {rec.recommended
            ? `Recommended: ${ADVISED_ESTIMATOR_LABELS[rec.recommended]}`
            : "No estimator meets the confidence"}
        </p>
        <p className="mt-1 text-sm text-ink-soft">{rec.summary}</p>
        <ul className="mt-2 space-y-1 text-sm text-ink">
          {rec.verdicts.map((v) => (
            <li key={v.estimator} className={`flex gap-2 ${v.verdict === "comparison" ? "text-ink-soft" : ""}`}>
              <span aria-hidden>{v.verdict === "recommended" ? "✓" : "·"}</span>
              <span>{v.reason}</span>
            </li>
          ))}
        </ul>
        {rec.tradeOff && (
          <p className="mt-2 text-sm text-ink" data-testid="trade-off">
            {rec.tradeOff}
          </p>
        )}
      </section>

      <dl className="grid gap-x-6 gap-y-1 text-sm sm:grid-cols-2">
        <div className="flex gap-2">
          <dt className="text-ink-soft">Assumed misstatements</dt>
          <dd className="text-ink">{scenarioInWords(run.request)}</dd>
        </div>
        <div className="flex gap-2">
          <dt className="text-ink-soft">True audited total under it</dt>
          <dd className="figures text-ink">
            {currency} {formatMoney(result.truth.auditedTotal)} (misstatement {formatMoney(result.truth.misstatement)},{" "}
            {formatCount(result.truth.misstatedItems)} items)
          </dd>
        </div>
        <div className="flex gap-2">
          <dt className="text-ink-soft">Trials, seed</dt>
          <dd className="figures text-ink">
            {formatCount(run.request.trials)} per size · seed {run.request.seed} ({run.request.seedSource})
          </dd>
        </div>
        <div className="flex gap-2">
          <dt className="text-ink-soft">Bound tested</dt>
          <dd className="text-ink">{boundInWords(run.request)}</dd>
        </div>
      </dl>

      <div className="overflow-x-auto">
        <Table density="compact">
          <caption className="sr-only">Estimator performance by sample size</caption>
          <THead>
            <tr>
              <Th>n</Th>
              <Th>Estimator</Th>
              <Th numeric>Bias</Th>
              <Th numeric>Std deviation</Th>
              <Th numeric>RMSE</Th>
              <Th numeric>Coverage</Th>
              <Th numeric>Mean allowance</Th>
            </tr>
          </THead>
          <tbody>
            {sizes.flatMap((n) =>
              result.cells
                .filter((c) => c.sampleSize === n)
                .map((c, i) => {
                  const best = n === rec.sampleSize && c.estimator === rec.recommended;
                  const short = c.performance.coverage < rec.coverageFloor;
                  return (
                    <tr
                      key={`${n}-${c.estimator}`}
                      className={`border-t border-ink-line ${best ? "bg-ledger-50" : ""}`}
                    >
                      <Td className="figures text-ink-soft">{i === 0 ? n : ""}</Td>
                      <Td className="text-ink">
                        {ADVISED_ESTIMATOR_LABELS[c.estimator]} {best && <Badge tone="green">recommended</Badge>}
                      </Td>
                      <Td numeric>{formatMoney(c.performance.bias)}</Td>
                      <Td numeric>{formatMoney(c.performance.standardDeviation)}</Td>
                      <Td numeric className="font-medium">
                        {formatMoney(c.performance.rmse)}
                      </Td>
                      <Td className={`figures pr-3 text-right ${short ? "text-brick-700" : ""}`}>
                        {pct(c.performance.coverage)}
                      </Td>
                      <Td numeric>{formatMoney(c.performance.meanAllowance)}</Td>
                    </tr>
                  );
                }),
            )}
          </tbody>
        </Table>
        <p className="mt-1 text-xs text-ink-faint">
          Coverage: share of trials whose bound held the true audited total. Below {pct(rec.coverageFloor)} (the
          confidence less two Monte Carlo standard errors) counts as short.
        </p>
      </div>

      <div>
        <h3 className="mb-2 text-sm font-medium text-ink">
          Estimates of the audited total at n = {rec.sampleSize}, {formatCount(run.request.trials)} trials each, on one
          scale
        </h3>
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          {atSize.map((c) => (
            <EstimateHistogram
              key={c.estimator}
              estimator={c.estimator}
              bins={c.performance.histogram}
              truth={result.truth.auditedTotal}
              from={from}
              to={to}
            />
          ))}
        </div>
        <EstimateZoom cells={atSize} truth={result.truth.auditedTotal} />
      </div>

      {sizes.length > 1 && (
        <div className="grid gap-3 md:grid-cols-2">
          <SizeChart
            title="RMSE against sample size"
            series={series((c) => c.performance.rmse)}
            format={compactFigure}
            yMin={0}
          />
          <SizeChart
            title="Coverage against sample size"
            series={series((c) => c.performance.coverage)}
            format={(v) => `${(v * 100).toFixed(0)}%`}
            reference={{ value: run.request.confidence, label: `confidence ${pct(run.request.confidence)}` }}
          />
        </div>
      )}
      {sizes.length > 1 && (
        <p className="flex flex-wrap gap-3 text-xs text-ink-soft">
          {estimators.map((e) => (
            <span key={e} className="inline-flex items-center gap-1.5">
              <EstimatorSwatch estimator={e} />
              {ADVISED_ESTIMATOR_LABELS[e]}
            </span>
          ))}
        </p>
      )}
      {result.notes.map((n) => (
        <p key={n} className="text-xs text-ink-soft">
          {n}
        </p>
      ))}
    </div>
  );
}
