import type { SampleEvaluation } from "./types";
import { Amount } from "@/components/ui/amount";
import { formatCount } from "@/lib/format/number";

/** How far fieldwork has got: items with a result of the total, and what has been found so far. */
export function ProgressStrip({ progress, attribute }: { progress: SampleEvaluation["progress"]; attribute: boolean }) {
  const withResult = progress.done + progress.notAuditable;
  const pct = progress.total === 0 ? 0 : (withResult / progress.total) * 100;
  const facts: [string, React.ReactNode, string][] = [
    [
      "Items with a result",
      <>
        <span key="a">{formatCount(withResult)}</span>
        <span key="b" className="text-ink-faint">
          {" "}
          of {formatCount(progress.total)}
        </span>
      </>,
      "progress-done",
    ],
    ["Could not be audited", formatCount(progress.notAuditable), "progress-not-auditable"],
    attribute
      ? ["Deviations found", formatCount(progress.deviations), "progress-deviations"]
      : ["Misstatements found", formatCount(progress.misstatements), "progress-misstatements"],
  ];
  if (!attribute)
    facts.push([
      "Misstatement so far",
      <Amount key="m" value={progress.misstatementTotal} />,
      "progress-misstatement-total",
    ]);
  if (progress.void > 0) facts.push(["Void (replaced)", formatCount(progress.void), "progress-void"]);
  return (
    <div className="space-y-2" data-testid="fieldwork-progress">
      <div
        className="h-2 overflow-hidden rounded-full bg-paper-sunk"
        role="progressbar"
        aria-label="Fieldwork progress"
        aria-valuemin={0}
        aria-valuemax={progress.total}
        aria-valuenow={withResult}
      >
        <div className="h-full rounded-full bg-ledger-500 transition-all" style={{ width: `${pct}%` }} />
      </div>
      <dl className="flex flex-wrap gap-x-8 gap-y-2 text-sm">
        {facts.map(([label, value, id]) => (
          <div key={label}>
            <dt className="text-xs uppercase tracking-wider text-ink-soft">{label}</dt>
            <dd className="figures text-lg font-semibold" data-testid={id}>
              {value}
            </dd>
          </div>
        ))}
      </dl>
    </div>
  );
}
