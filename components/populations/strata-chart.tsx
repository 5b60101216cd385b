import type { PopulationProfile } from "@/lib/data/population-items";
import { formatCount, formatMoney } from "@/lib/format/number";

const ROW = 40;
const LABEL_W = 170;
const BAR_W = 420;
const FIGURES_W = 250;
const WIDTH = LABEL_W + BAR_W + FIGURES_W;

/**
 * Book-value bands (a band per power of ten, zeros and credits apart) as paired horizontal bars:
 * the share of items and the share of value (by absolute amount). Percentages are for display only.
 */
export function StrataChart({ strata }: { strata: PopulationProfile["strata"] }) {
  const items = strata.reduce((s, b) => s + b.count, 0);
  const value = strata.reduce((s, b) => s + Math.abs(Number(b.total)), 0);
  const share = (part: number, whole: number) => (whole === 0 ? 0 : part / whole);
  const pct = (x: number) => `${(x * 100).toFixed(x < 0.1 ? 1 : 0)}%`;
  const height = strata.length * ROW + 30;
  return (
    <figure className="space-y-2">
      <svg
        viewBox={`0 0 ${WIDTH} ${height}`}
        className="w-full"
        role="img"
        aria-label="Book-value strata: share of items and share of value per band"
      >
        <g transform="translate(0, 14)" className="text-[11px]">
          <text x={LABEL_W} y={0} className="fill-ink-soft">
            Share of items
          </text>
          <rect x={LABEL_W + 90} y={-9} width={10} height={10} className="fill-slate-500" />
          <text x={LABEL_W + 120} y={0} className="fill-ink-soft">
            Share of value
          </text>
          <rect x={LABEL_W + 205} y={-9} width={10} height={10} className="fill-ledger-500" />
        </g>
        {strata.map((band, i) => {
          const y = 26 + i * ROW;
          const c = share(band.count, items);
          const v = share(Math.abs(Number(band.total)), value);
          const credit = band.from === null;
          return (
            <g key={band.label} transform={`translate(0, ${y})`}>
              <title>{`${band.label}: ${formatCount(band.count)} items, ${formatMoney(band.total)}`}</title>
              <text x={LABEL_W - 10} y={19} textAnchor="end" className="figures fill-ink text-[12px]">
                {band.label}
              </text>
              <rect x={LABEL_W} y={4} width={BAR_W} height={12} className="fill-paper-sunk" />
              <rect
                x={LABEL_W}
                y={4}
                width={Math.max(c > 0 ? 1 : 0, c * BAR_W)}
                height={12}
                className="fill-slate-500"
              />
              <rect x={LABEL_W} y={19} width={BAR_W} height={12} className="fill-paper-sunk" />
              <rect
                x={LABEL_W}
                y={19}
                width={Math.max(v > 0 ? 1 : 0, v * BAR_W)}
                height={12}
                className={credit ? "fill-brick-500" : "fill-ledger-500"}
              />
              <text x={LABEL_W + BAR_W + 10} y={14} className="figures fill-ink-soft text-[11px]">
                {formatCount(band.count)} items · {pct(c)}
              </text>
              <text x={LABEL_W + BAR_W + 10} y={30} className="figures fill-ink text-[11px]">
                {formatMoney(band.total)} · {pct(v)}
              </text>
            </g>
          );
        })}
      </svg>
      <figcaption className="text-xs text-ink-soft">
        Bands grow tenfold (log scale). Value shares are of the absolute book value, so credits count by their size.
      </figcaption>
    </figure>
  );
}
