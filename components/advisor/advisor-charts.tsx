import type { AdvisedEstimator, HistogramBin } from "@/lib/sampling";
import { ADVISED_ESTIMATOR_LABELS } from "@/lib/sampling/advise";

/** Each estimator's colour as Tailwind theme classes (tailwind.config.ts), written out so Tailwind finds them. */
export const ESTIMATOR_TONES: Record<AdvisedEstimator, { fill: string; stroke: string; swatch: string }> = {
  "mean-per-unit": {
    fill: "fill-chart-mean-per-unit",
    stroke: "stroke-chart-mean-per-unit",
    swatch: "bg-chart-mean-per-unit",
  },
  difference: { fill: "fill-ledger-600", stroke: "stroke-ledger-600", swatch: "bg-ledger-600" },
  ratio: { fill: "fill-amber-500", stroke: "stroke-amber-500", swatch: "bg-amber-500" },
  regression: { fill: "fill-chart-regression", stroke: "stroke-chart-regression", swatch: "bg-chart-regression" },
  stringer: { fill: "fill-brick-500", stroke: "stroke-brick-500", swatch: "bg-brick-500" },
  "hartley-ross": {
    fill: "fill-chart-hartley-ross",
    stroke: "stroke-chart-hartley-ross",
    swatch: "bg-chart-hartley-ross",
  },
  "jackknife-ratio": {
    fill: "fill-chart-jackknife-ratio",
    stroke: "stroke-chart-jackknife-ratio",
    swatch: "bg-chart-jackknife-ratio",
  },
  "beale-ratio": { fill: "fill-chart-beale-ratio", stroke: "stroke-chart-beale-ratio", swatch: "bg-chart-beale-ratio" },
  "tin-ratio": { fill: "fill-chart-tin-ratio", stroke: "stroke-chart-tin-ratio", swatch: "bg-chart-tin-ratio" },
};

/** The small colour square beside an estimator's name in a caption or legend. */
export function EstimatorSwatch({ estimator }: { estimator: AdvisedEstimator }) {
  return <span aria-hidden className={`inline-block h-2.5 w-2.5 rounded-sm ${ESTIMATOR_TONES[estimator].swatch}`} />;
}

const compact = (v: number) => {
  const a = Math.abs(v);
  const s =
    a >= 1e9
      ? `${(a / 1e9).toFixed(2)}bn`
      : a >= 1e6
        ? `${(a / 1e6).toFixed(2)}m`
        : a >= 1e4
          ? `${(a / 1e3).toFixed(0)}k`
          : a.toFixed(0);
  return v < 0 ? `−${s}` : s;
};

/**
 * Distribution of one estimator's estimates over the trials, with the true audited total marked; with
 * `mean` (the zoomed view, on the estimator's own range) its mean estimate is marked too, so bias
 * (the gap between the two lines) and spread (the width) can be seen apart.
 */
export function EstimateHistogram({
  estimator,
  bins,
  truth,
  from,
  to,
  mean,
}: {
  estimator: AdvisedEstimator;
  bins: HistogramBin[];
  truth: number;
  from: number;
  to: number;
  mean?: number;
}) {
  const W = 260,
    H = 120,
    PAD = 18;
  const max = Math.max(1, ...bins.map((b) => b.count));
  const span = to - from || 1;
  const x = (v: number) => PAD + ((v - from) / span) * (W - 2 * PAD);
  const label = ADVISED_ESTIMATOR_LABELS[estimator];
  return (
    <figure className="rounded-md border border-ink-line bg-paper p-2">
      <figcaption className="mb-1 flex items-center gap-1.5 text-xs font-medium text-ink">
        <EstimatorSwatch estimator={estimator} />
        {label}
      </figcaption>
      <svg
        viewBox={`0 0 ${W} ${H}`}
        className="w-full"
        role="img"
        aria-label={`${mean === undefined ? "" : "Zoomed, own scale: "}${label}: histogram of estimated audited totals from ${compact(bins[0]?.from ?? 0)} to ${compact(bins.at(-1)?.to ?? 0)}; true value ${compact(truth)}${mean === undefined ? "" : `; mean estimate ${compact(mean)}`}`}
      >
        {bins.map((b, i) => {
          const h = (b.count / max) * (H - 34);
          return (
            <rect
              key={i}
              x={x(b.from)}
              y={H - 18 - h}
              width={Math.max(1, x(b.to) - x(b.from) - 1)}
              height={h}
              className={ESTIMATOR_TONES[estimator].fill}
              opacity={0.8}
            />
          );
        })}
        <line x1={PAD} x2={W - PAD} y1={H - 18} y2={H - 18} className="stroke-ink-line" />
        <line
          x1={x(truth)}
          x2={x(truth)}
          y1={8}
          y2={H - 18}
          className="stroke-chart-truth"
          strokeWidth={1.5}
          strokeDasharray="3 2"
        />
        <text
          x={x(truth)}
          y={7}
          textAnchor={mean !== undefined && mean < truth ? "start" : mean !== undefined ? "end" : "middle"}
          fontSize="9"
          className="fill-ink"
        >
          true {compact(truth)}
        </text>
        {mean !== undefined && (
          <g>
            <line
              x1={x(mean)}
              x2={x(mean)}
              y1={16}
              y2={H - 18}
              className={ESTIMATOR_TONES[estimator].stroke}
              strokeWidth={1.5}
            />
            <text
              x={x(mean)}
              y={24}
              textAnchor={mean < truth ? "end" : "start"}
              fontSize="9"
              className={ESTIMATOR_TONES[estimator].fill}
            >
              mean {compact(mean)}
            </text>
          </g>
        )}
        <text x={PAD} y={H - 5} fontSize="9" className="fill-ink-faint" fontFamily="IBM Plex Mono, monospace">
          {compact(from)}
        </text>
        <text
          x={W - PAD}
          y={H - 5}
          textAnchor="end"
          fontSize="9"
          className="fill-ink-faint"
          fontFamily="IBM Plex Mono, monospace"
        >
          {compact(to)}
        </text>
      </svg>
    </figure>
  );
}

export interface SeriesPoint {
  sampleSize: number;
  value: number;
}

/** One line per estimator against sample size; `reference` draws a marked horizontal line (the confidence). */
export function SizeChart({
  title,
  series,
  format,
  reference,
  yMin,
}: {
  title: string;
  series: { estimator: AdvisedEstimator; points: SeriesPoint[] }[];
  format: (v: number) => string;
  reference?: { value: number; label: string };
  yMin?: number;
}) {
  const W = 340,
    H = 190,
    L = 52,
    R = 26,
    T = 14,
    B = 28;
  const sizes = [...new Set(series.flatMap((s) => s.points.map((p) => p.sampleSize)))].sort((a, b) => a - b);
  const values = series.flatMap((s) => s.points.map((p) => p.value)).concat(reference ? [reference.value] : []);
  const lo = yMin ?? Math.min(0, ...values);
  const hi = Math.max(...values, lo + 1e-9);
  const x = (n: number) =>
    sizes.length === 1 ? (L + W - R) / 2 : L + ((n - sizes[0]) / (sizes.at(-1)! - sizes[0])) * (W - L - R);
  const y = (v: number) => T + (1 - (v - lo) / (hi - lo)) * (H - T - B);
  const ticks = [0, 0.5, 1].map((f) => lo + f * (hi - lo));
  return (
    <figure className="rounded-md border border-ink-line bg-paper p-2">
      <figcaption className="mb-1 text-xs font-medium text-ink">{title}</figcaption>
      <svg
        viewBox={`0 0 ${W} ${H}`}
        className="w-full"
        role="img"
        aria-label={`${title}: ${series.map((s) => `${ADVISED_ESTIMATOR_LABELS[s.estimator]} ${s.points.map((p) => `n=${p.sampleSize} ${format(p.value)}`).join(", ")}`).join("; ")}`}
      >
        {ticks.map((t) => (
          <g key={t}>
            <line x1={L} x2={W - R} y1={y(t)} y2={y(t)} className="stroke-chart-grid" />
            <text
              x={L - 6}
              y={y(t) + 3}
              textAnchor="end"
              fontSize="9"
              className="fill-ink-faint"
              fontFamily="IBM Plex Mono, monospace"
            >
              {format(t)}
            </text>
          </g>
        ))}
        {sizes.map((n) => (
          <text
            key={n}
            x={x(n)}
            y={H - 10}
            textAnchor="middle"
            fontSize="9"
            className="fill-ink-faint"
            fontFamily="IBM Plex Mono, monospace"
          >
            n={n}
          </text>
        ))}
        {reference && (
          <g>
            <line
              x1={L}
              x2={W - R}
              y1={y(reference.value)}
              y2={y(reference.value)}
              className="stroke-amber-500"
              strokeWidth={1.5}
              strokeDasharray="4 3"
            />
            <text x={W - R} y={y(reference.value) - 4} textAnchor="end" fontSize="9" className="fill-amber-700">
              {reference.label}
            </text>
          </g>
        )}
        {series.map((s) => (
          <g key={s.estimator}>
            <polyline
              fill="none"
              className={ESTIMATOR_TONES[s.estimator].stroke}
              strokeWidth={2}
              points={s.points.map((p) => `${x(p.sampleSize)},${y(p.value)}`).join(" ")}
            />
            {s.points.map((p) => (
              <circle
                key={p.sampleSize}
                cx={x(p.sampleSize)}
                cy={y(p.value)}
                r={3}
                className={ESTIMATOR_TONES[s.estimator].fill}
              />
            ))}
          </g>
        ))}
      </svg>
    </figure>
  );
}

export { compact as compactFigure };
