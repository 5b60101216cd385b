import Link from "next/link";
import { formatDateTime } from "@/lib/format/date";
import type { SampleRecord } from "@/lib/data/samples";
import { Amount } from "@/components/ui/amount";
import { SizePanel } from "./size-panel";
import { DIRECTION_LABELS, ESTIMATOR_LABELS, METHOD_LABELS } from "./labels";
import { RISK_LEVEL_LABELS } from "@/lib/validation/methodology";
import { factorModeOfSample } from "@/lib/samples/methodology";
import { formatPercent } from "@/lib/format/number";

/** The plan as recorded: what is tested, the parameters, the size and how it was computed. */
export function PlanSummary({
  sample,
  currency,
  performanceMateriality,
  editHref,
}: {
  sample: SampleRecord;
  currency: string;
  performanceMateriality: string;
  editHref: string | null;
}) {
  const p = sample.params;
  const facts: [string, React.ReactNode][] = [
    ["Objective", sample.objective],
    ["Assertion", sample.assertion],
    ["Method", METHOD_LABELS[sample.method]],
  ];
  if (sample.method !== "attribute") facts.push(["Misstatement tested for", DIRECTION_LABELS[sample.direction]]);
  if (p.estimator) facts.push(["Estimator", ESTIMATOR_LABELS[p.estimator] ?? p.estimator]);
  const risk = sample.plan.risk;
  if (risk?.assessedRisk && risk.otherProceduresRisk) {
    facts.push([
      "Assessed risks",
      `RMM ${RISK_LEVEL_LABELS[risk.assessedRisk]} · other procedures ${RISK_LEVEL_LABELS[risk.otherProceduresRisk]} → factor ${risk.tableFactor?.toFixed(2)} (firm methodology ${risk.tableVersion === 0 ? "defaults, version 0" : `version ${risk.tableVersion}`})`,
    ]);
  }
  facts.push([
    "Confidence",
    `${formatPercent(p.confidence, 2)}${risk?.basis === "confidence-override" ? " (typed override)" : risk?.basis === "risk-assessment" ? " (from the risk assessment)" : ""}`,
  ]);
  if (risk?.overrideReason) facts.push(["Reason for the typed confidence", risk.overrideReason]);
  const ns = sample.plan.nonstatistical;
  if (ns)
    facts.push(
      ["Assurance factor", ns.assuranceFactor.toFixed(2)],
      [
        "Selection",
        ns.selection === "haphazard"
          ? "Haphazard (picked by the auditor; not re-performable from a seed)"
          : ns.selection === "systematic"
            ? "Systematic with a random start"
            : "Random (seeded)",
      ],
      ["Projection", ns.projection === "ratio" ? "Ratio method" : "Difference method"],
    );
  const k = sample.plan.keyItems;
  if (k)
    facts.push([
      "Key items",
      <span key="k">
        <span className="figures">{k.count}</span> items, <Amount value={k.total} />
        {k.threshold && (
          <>
            {" "}
            (threshold <Amount value={k.threshold} />)
          </>
        )}
        ; sample drawn on the other <span className="figures">{k.remainder.count}</span>
      </span>,
    ]);
  if (sample.method === "attribute") {
    facts.push(
      ["Tolerable deviation rate", formatPercent(p.tolerableRate ?? 0)],
      ["Expected deviation rate", formatPercent(p.expectedRate)],
    );
  } else {
    facts.push(
      [
        "Tolerable misstatement",
        <>
          <Amount key="tm" value={p.tolerableMisstatement ?? performanceMateriality} />
          {!p.tolerableMisstatement && (
            <span key="d" className="ml-1 text-xs text-ink-faint">
              (performance materiality)
            </span>
          )}
        </>,
      ],
      ["Expected misstatement", <Amount key="em" value={p.expectedMisstatement} />],
    );
  }
  if (["random", "systematic", "stratified"].includes(sample.method)) {
    facts.push([
      "Risk of incorrect rejection",
      `${formatPercent(p.riskOfIncorrectRejection)}, ${sample.plan.sides === "one" ? "one-sided z_α (one direction tested)" : "two-sided z_α"}`,
    ]);
    facts.push([
      "Bounds",
      sample.methodology.classicalDistribution === "t"
        ? "Student t (firm methodology at planning)"
        : "Normal z (firm methodology at planning)",
    ]);
  }
  if (sample.method === "mus")
    facts.push([
      "Limits compared with TM",
      sample.methodology.musLimits === "gross"
        ? "Gross (firm methodology at planning)"
        : "Net of the other direction's projected misstatement (firm methodology at planning)",
    ]);
  if (sample.plan.twoStage)
    facts.push([
      "Plan",
      `Two-stage: ${sample.plan.twoStage.firstStageSize} then, after exactly one deviation, ${sample.plan.twoStage.secondStageSize} more (risk of overreliance ${formatPercent(sample.plan.twoStage.riskOfOverreliance, 2)})`,
    ]);
  if (sample.method === "mus")
    facts.push([
      "Poisson factors",
      factorModeOfSample(sample) === "exact"
        ? "Exact (firm methodology at planning)"
        : "Table, 2 decimals (firm methodology at planning)",
    ]);
  facts.push([
    "Size",
    <span key="sz" className="figures">
      {sample.chosenSize}
      {sample.chosenSize !== sample.computedSize && ` (computed ${sample.computedSize})`}
    </span>,
  ]);
  if (sample.sizeReason) facts.push(["Reason for the size", sample.sizeReason]);
  facts.push([
    "Planned",
    `${formatDateTime(sample.createdAt)} by ${sample.createdByName} · plan version ${sample.planVersion}`,
  ]);
  return (
    <div className="grid gap-6 lg:grid-cols-5">
      <div className="lg:col-span-3">
        <dl className="divide-y divide-ink-line/60 text-sm">
          {facts.map(([label, value]) => (
            <div key={label} className="grid grid-cols-3 gap-3 py-2">
              <dt className="text-ink-soft">{label}</dt>
              <dd className="col-span-2">{value}</dd>
            </div>
          ))}
        </dl>
        {editHref && (
          <Link href={editHref} className="mt-3 inline-block text-sm font-medium text-ledger-600 link">
            Change the plan (possible until the draw)
          </Link>
        )}
      </div>
      <div className="lg:col-span-2">
        <SizePanel plan={sample.plan} problem={null} busy={false} currency={currency} />
      </div>
    </div>
  );
}
