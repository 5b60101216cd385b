import type { SampleRecord } from "@/lib/data/samples";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { formatAmount } from "@/components/ui/amount";
import type { SampleEvaluation } from "./types";
import { BoundChart } from "./bound-chart";
import { StringerTables } from "./stringer-table";
import { VariablesResult } from "./variables-result";
import { AttributeResult } from "./attribute-result";
import { formatPercent } from "./labels";

const shortAmount = (n: number) => (Math.abs(n) >= 1e6 ? `${(n / 1e6).toFixed(2)}m` : Math.abs(n) >= 1e4 ? `${(n / 1e3).toFixed(1)}k` : formatAmount(n));

function Chart({ e, direction }: { e: SampleEvaluation; direction: SampleRecord["direction"] }) {
  const ev = e.evaluation!;
  if (ev.kind === "attribute") {
    return <BoundChart title="Deviation rate" rows={[{ label: "Deviation rate", projected: ev.sampleRate, upper: ev.upperLimit }]} tolerable={ev.tolerableRate} tolerableLabel="Tolerable rate" format={(n) => formatPercent(n, 1)} cap={1} legend={{ projected: "sample deviation rate", upper: "to the upper deviation limit" }} />;
  }
  const tm = Number(e.tolerableMisstatement);
  const rows = ev.kind === "mus"
    ? (direction === "both" ? (["overstatement", "understatement"] as const) : [direction]).map((d) => ({ label: d === "overstatement" ? "Overstatement" : "Understatement", projected: Math.max(0, ev.result[d].projected), upper: ev.result[d].upperLimit }))
    : [
        ...(ev.misstatementBounds.overstatement !== null ? [{ label: "Overstatement", projected: Math.max(0, ev.result.projectedMisstatement), upper: ev.misstatementBounds.overstatement }] : []),
        ...(ev.misstatementBounds.understatement !== null ? [{ label: "Understatement", projected: Math.max(0, -ev.result.projectedMisstatement), upper: ev.misstatementBounds.understatement }] : []),
      ];
  return <BoundChart title="Projected misstatement and upper bound" rows={rows} tolerable={tm} tolerableLabel="Tolerable misstatement" format={shortAmount} />;
}

/** Where the sample stands: the method's figures, a chart against the tolerable figure, the conclusion and the caution. */
export function EvaluationPanel({ evaluation: e, direction, bookValue, loading }: { evaluation: SampleEvaluation | null; direction: SampleRecord["direction"]; bookValue: string; loading: boolean }) {
  if (!e) return <p className="text-sm text-ink-soft" aria-live="polite">{loading ? "Evaluating…" : "No evaluation yet."}</p>;
  const ev = e.evaluation;
  const tone = e.supported === true ? "success" : e.supported === false ? "error" : "info";
  return (
    <div className={`space-y-5 transition-opacity ${loading ? "opacity-60" : ""}`} aria-busy={loading} data-testid="evaluation-panel">
      <div className="flex flex-wrap items-center gap-2 text-sm">
        {e.complete ? <Badge tone="green">all items have a result</Badge> : <Badge tone="amber">provisional</Badge>}
        <span className="text-ink-soft">Confidence {formatPercent(e.confidence)}{e.tolerableMisstatement !== null && <> · tolerable misstatement <span className="figures">{formatAmount(e.tolerableMisstatement)}</span></>}</span>
      </div>
      <div aria-live="polite" data-testid="conclusion"><Alert tone={tone}>{e.conclusion}</Alert></div>
      {ev && (
        <>
          <Chart e={e} direction={direction} />
          {ev.kind === "mus" && <StringerTables mus={ev} direction={direction} />}
          {ev.kind === "variables" && <VariablesResult v={ev} bookValue={bookValue} />}
          {ev.kind === "attribute" && <AttributeResult a={ev} />}
        </>
      )}
      {e.warnings.length > 0 && <ul className="space-y-1 text-sm text-amber-700">{e.warnings.map((w) => <li key={w}>⚠ {w}</li>)}</ul>}
      <p className="border-t border-ink-line pt-3 text-xs leading-relaxed text-ink-soft" data-testid="judgement-caution">{e.caution}</p>
    </div>
  );
}
