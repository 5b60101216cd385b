import type { SampleRecord } from "@/lib/data/samples";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import type { SampleEvaluation } from "./types";
import { BoundChart } from "./bound-chart";
import { StringerTables } from "./stringer-table";
import { VariablesResult } from "./variables-result";
import { AttributeResult } from "./attribute-result";
import { NonstatisticalResult } from "./nonstatistical-result";
import { formatMoney, formatPercent } from "@/lib/format/number";

const shortAmount = (n: number) =>
  Math.abs(n) >= 1e6 ? `${(n / 1e6).toFixed(2)}m` : Math.abs(n) >= 1e4 ? `${(n / 1e3).toFixed(1)}k` : formatMoney(n);
const TONE = {
  supported: "success",
  "not-supported": "error",
  provisional: "info",
  "no-results": "info",
  "not-evaluable": "info",
} as const;

/** A picture of the view model's figures against tolerable (the chart reads the figures; it decides nothing). */
function Chart({ e, direction }: { e: SampleEvaluation; direction: SampleRecord["direction"] }) {
  const b = e.block!;
  if (b.method === "attributes") {
    if (b.controlFrequency) return null; // no tolerable rate to draw against: the test expects no deviation
    return (
      <BoundChart
        title="Deviation rate"
        rows={[{ label: "Deviation rate", projected: b.sampleRate, upper: b.upperDeviationLimit }]}
        tolerable={b.tolerableRate}
        tolerableLabel="Tolerable rate"
        format={(n) => formatPercent(n, 1)}
        cap={1}
        legend={{ projected: "sample deviation rate", upper: "to the upper deviation limit" }}
      />
    );
  }
  const tm = Number(e.tolerableMisstatement);
  const tested = direction === "both" ? (["overstatement", "understatement"] as const) : [direction];
  // A nonstatistical evaluation claims no bound: its table compares the total with TM, no bar chart of limits.
  if (b.method === "nonstatistical") return null;
  const rows =
    b.method === "mus"
      ? tested.map((d) => ({
          label: d === "overstatement" ? "Overstatement" : "Understatement",
          projected: Math.max(0, Number(b[d].projected)),
          upper: Number(b.compared[d] ?? b[d].upperLimit),
        }))
      : tested.map((d) => {
          const pm = Number(b.projectedMisstatement) * (d === "overstatement" ? 1 : -1);
          return {
            label: d === "overstatement" ? "Overstatement" : "Understatement",
            projected: Math.max(0, pm),
            upper: Math.max(0, pm) + Number(b.decision.allowance),
          };
        });
  return (
    <BoundChart
      title={b.method === "mus" ? "Projected misstatement and upper limit" : "Projected misstatement and allowance"}
      rows={rows}
      tolerable={tm}
      tolerableLabel="Tolerable misstatement"
      format={shortAmount}
    />
  );
}

/** Where the sample stands: the result computed by Sondage (with its rule), the method's figures, notes and the caution. */
export function EvaluationPanel({
  evaluation: e,
  direction,
  loading,
}: {
  evaluation: SampleEvaluation | null;
  direction: SampleRecord["direction"];
  loading: boolean;
}) {
  if (!e)
    return (
      <p className="text-sm text-ink-soft" aria-live="polite">
        {loading ? "Evaluating…" : "No evaluation yet."}
      </p>
    );
  const b = e.block;
  return (
    <div
      className={`space-y-5 transition-opacity ${loading ? "opacity-60" : ""}`}
      aria-busy={loading}
      data-testid="evaluation-panel"
    >
      <div className="flex flex-wrap items-center gap-2 text-sm">
        {e.complete ? <Badge tone="green">all items have a result</Badge> : <Badge tone="amber">provisional</Badge>}
        <span className="text-ink-soft">
          {b?.method === "nonstatistical"
            ? "Nonstatistical: no confidence level is claimed"
            : `Confidence ${formatPercent(e.confidence)}`}
          {e.tolerableMisstatement !== null && (
            <>
              {" "}
              · tolerable misstatement <span className="figures">{formatMoney(e.tolerableMisstatement)}</span>
            </>
          )}
        </span>
      </div>
      <div aria-live="polite" data-testid="conclusion">
        <Alert tone={TONE[e.computed.status]}>
          <span className="block text-xs font-semibold uppercase tracking-wider">
            Computed by Sondage — not the auditor&apos;s conclusion
          </span>
          {e.computed.statement}
        </Alert>
      </div>
      {b && (
        <>
          <Chart e={e} direction={direction} />
          {b.method === "mus" && <StringerTables mus={b} />}
          {(b.method === "variables" || b.method === "stratified") && <VariablesResult v={b} />}
          {b.method === "attributes" && <AttributeResult a={b} />}
          {b.method === "nonstatistical" && <NonstatisticalResult n={b} />}
        </>
      )}
      {e.computed.rule !== "" && b?.method === "mus" && (
        <p className="text-xs text-ink-soft" data-testid="computed-rule">
          Rule: {e.computed.rule}
        </p>
      )}
      {e.warnings.length > 0 && (
        <ul className="space-y-1 text-sm text-amber-700">
          {e.warnings.map((w) => (
            <li key={w}>⚠ {w}</li>
          ))}
        </ul>
      )}
      <ul className="space-y-1 text-xs text-ink-soft" data-testid="evaluation-notes">
        {e.notes.map((n) => (
          <li key={n}>{n}</li>
        ))}
      </ul>
      <p
        className="border-t border-ink-line pt-3 text-xs leading-relaxed text-ink-soft"
        data-testid="judgement-caution"
      >
        {e.caution}
      </p>
    </div>
  );
}
