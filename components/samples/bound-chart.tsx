interface ChartRow {
  label: string;
  projected: number;
  upper: number;
}

interface Props {
  rows: ChartRow[];
  tolerable: number;
  tolerableLabel: string;
  format: (n: number) => string;
  title: string;
  /** Highest value the axis may reach (1 for rates). */
  cap?: number;
  legend?: { projected: string; upper: string };
}

const W = 640,
  LEFT = 132,
  RIGHT = 24,
  ROW = 46,
  TOP = 30;

/** Round steps for the axis (1, 2, 2.5 or 5 × 10^k) from 0 to at most `max`, about four of them (common practice). */
export function axisTicks(max: number): number[] {
  if (!(max > 0) || !Number.isFinite(max)) return [0];
  const rough = max / 4;
  const power = 10 ** Math.floor(Math.log10(rough));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * power).find((s) => s >= rough)!;
  const ticks: number[] = [];
  for (let i = 0; i * step <= max * (1 + 1e-12); i++) ticks.push(Number((i * step).toPrecision(12)));
  return ticks;
}

/**
 * Each direction as a bar: solid to the projected (most likely) figure, lighter on to the upper
 * bound, against a marked line at the tolerable figure. Outside the line means not supported.
 */
export function BoundChart({
  rows,
  tolerable,
  tolerableLabel,
  format,
  title,
  cap = Infinity,
  legend = { projected: "projected", upper: "allowance to the upper bound" },
}: Props) {
  const max = Math.min(
    cap,
    Math.max(tolerable, ...rows.map((r) => r.upper), ...rows.map((r) => r.projected), 1e-9) * 1.12,
  );
  const x = (v: number) => LEFT + (Math.max(0, v) / max) * (W - LEFT - RIGHT);
  const height = TOP + rows.length * ROW + 22;
  const ticks = axisTicks(max);
  return (
    <figure className="space-y-1">
      <svg
        viewBox={`0 0 ${W} ${height}`}
        className="w-full max-w-3xl"
        role="img"
        aria-label={`${title}: ${rows.map((r) => `${r.label} projected ${format(r.projected)}, upper bound ${format(r.upper)}`).join("; ")}; ${tolerableLabel} ${format(tolerable)}`}
      >
        <defs>
          <pattern
            id="allowance-hatch"
            width="6"
            height="6"
            patternUnits="userSpaceOnUse"
            patternTransform="rotate(45)"
          >
            <rect width="6" height="6" className="fill-ledger-100" />
            <line x1="0" y1="0" x2="0" y2="6" className="stroke-ledger-500" strokeWidth="1.5" opacity="0.45" />
          </pattern>
        </defs>
        {ticks.map((t) => (
          <g key={t}>
            <line x1={x(t)} x2={x(t)} y1={TOP - 6} y2={height - 22} className="stroke-ink-line" strokeDasharray="2 3" />
            <text
              x={x(t)}
              y={height - 6}
              textAnchor="middle"
              className="fill-ink-faint"
              fontSize="10"
              fontFamily="IBM Plex Mono, monospace"
            >
              {format(t)}
            </text>
          </g>
        ))}
        {rows.map((r, i) => {
          const y = TOP + i * ROW;
          const over = r.upper > tolerable;
          return (
            <g key={r.label}>
              <text x={LEFT - 10} y={y + 17} textAnchor="end" fontSize="12" className="fill-ink">
                {r.label}
              </text>
              <rect
                x={x(0)}
                y={y + 4}
                width={Math.max(0, x(r.upper) - x(0))}
                height={20}
                rx={3}
                fill="url(#allowance-hatch)"
                className={over ? "stroke-brick-500" : "stroke-ledger-500"}
                strokeWidth="1"
              />
              <rect
                x={x(0)}
                y={y + 4}
                width={Math.max(0, x(r.projected) - x(0))}
                height={20}
                rx={3}
                className={over ? "fill-brick-500" : "fill-ledger-600"}
              />
              <text
                x={Math.min(x(r.upper) + 6, W - RIGHT)}
                y={y + 38}
                textAnchor={x(r.upper) + 6 > W - 120 ? "end" : "start"}
                fontSize="10"
                className="fill-ink-soft"
                fontFamily="IBM Plex Mono, monospace"
              >
                {format(r.projected)} → {format(r.upper)}
              </text>
            </g>
          );
        })}
        <line
          x1={x(tolerable)}
          x2={x(tolerable)}
          y1={TOP - 14}
          y2={height - 22}
          className="stroke-amber-500"
          strokeWidth="2"
        />
        <text
          x={x(tolerable)}
          y={TOP - 18}
          textAnchor={x(tolerable) > W - 140 ? "end" : "middle"}
          fontSize="11"
          fontWeight="600"
          className="fill-amber-700"
        >
          {tolerableLabel} {format(tolerable)}
        </text>
      </svg>
      <figcaption className="flex flex-wrap gap-4 text-xs text-ink-soft">
        <span className="inline-flex items-center gap-1.5">
          <span aria-hidden className="inline-block h-3 w-4 rounded-sm bg-ledger-600" /> {legend.projected}
        </span>
        <span className="inline-flex items-center gap-1.5">
          <span aria-hidden className="inline-block h-3 w-4 rounded-sm border border-ledger-500 bg-ledger-100" />{" "}
          {legend.upper}
        </span>
        <span className="inline-flex items-center gap-1.5">
          <span aria-hidden className="inline-block h-3 w-0.5 bg-amber-500" /> {tolerableLabel.toLowerCase()}
        </span>
      </figcaption>
    </figure>
  );
}
