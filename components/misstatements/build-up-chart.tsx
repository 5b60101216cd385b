import type { SummaryView } from "@/lib/misstatements/types";
import { formatMoney } from "@/lib/format/number";

const W = 560,
  LABEL = 200,
  ROW = 28,
  PAD = 26;

/** The build-up of uncorrected misstatement as bars against performance and overall materiality (an SVG with a text alternative). */
export function BuildUpChart({ view }: { view: SummaryView }) {
  const t = view.totals;
  const bars = [
    { label: "Factual", value: t.uncorrected.factual },
    { label: "Judgemental", value: t.uncorrected.judgemental },
    { label: "Projected", value: t.uncorrected.projected },
    { label: "Total, income-statement approach", value: t.incomeStatementApproach.total },
    { label: "Total, balance-sheet approach", value: t.balanceSheetApproach.total },
    { label: "Larger total + allowances", value: t.upperEstimate },
  ];
  const overall = Number(view.materiality.overall),
    performance = Number(view.materiality.performance);
  const scale = Math.max(overall, ...bars.map((b) => Math.abs(Number(b.value)))) * 1.08 || 1;
  const x = (v: number) => LABEL + (Math.abs(v) / scale) * (W - LABEL - 90);
  const height = bars.length * ROW + PAD * 2;
  const summary = `${bars.map((b) => `${b.label} ${formatMoney(b.value)}`).join("; ")}; performance materiality ${formatMoney(view.materiality.performance)}; overall materiality ${formatMoney(view.materiality.overall)}.`;
  return (
    <figure>
      <svg
        viewBox={`0 0 ${W} ${height}`}
        role="img"
        aria-labelledby="build-up-title build-up-desc"
        className="w-full max-w-3xl"
      >
        <title id="build-up-title">Build-up of uncorrected misstatement against materiality</title>
        <desc id="build-up-desc">{summary}</desc>
        {bars.map((b, i) => {
          const v = Number(b.value),
            y = PAD + i * ROW;
          return (
            <g key={b.label}>
              <text x={0} y={y + 15} className="fill-ink-soft text-[13px]">
                {b.label}
              </text>
              <rect
                x={LABEL}
                y={y + 4}
                width={Math.max(x(v) - LABEL, 1)}
                height={14}
                rx={2}
                className={v < 0 ? "fill-slate-500" : i >= 3 ? "fill-ledger-700" : "fill-ledger-500"}
              />
              <text x={x(v) + 6} y={y + 15} className="fill-ink text-[13px] tabular-nums">
                {formatMoney(b.value)}
              </text>
            </g>
          );
        })}
        {[
          { v: performance, label: "Performance", cls: "stroke-amber-500 fill-amber-700" },
          { v: overall, label: "Overall", cls: "stroke-brick-500 fill-brick-700" },
        ].map((l) => (
          <g key={l.label} className={l.cls}>
            <line x1={x(l.v)} x2={x(l.v)} y1={PAD - 6} y2={height - PAD + 6} strokeWidth={2} strokeDasharray="5 3" />
            <text
              x={x(l.v) - 4}
              y={l.label === "Overall" ? height - 4 : 12}
              textAnchor="end"
              className="stroke-none text-[13px]"
            >
              {l.label} {formatMoney(l.v)}
            </text>
          </g>
        ))}
      </svg>
      <figcaption className="mt-1 text-xs text-ink-soft">
        Bars show absolute values (slate: a net understatement). Dashed lines: performance materiality (amber) and
        overall materiality (brick).
      </figcaption>
    </figure>
  );
}
