import type { AttributesEvaluationBlock } from "@/lib/samples/evaluation-types";
import { formatPercent } from "@/lib/format/number";
import { Table, Th, Td } from "@/components/ui/table";

/** Deviations against the tolerable rate, with the one-sided upper deviation limit, as the view model gives them. */
export function AttributeResult({ a }: { a: AttributesEvaluationBlock }) {
  const rows: [string, string, string?][] = [
    ["Items with a result", String(a.sampleSize)],
    ["Deviations (items that could not be audited count as deviations)", String(a.deviations), "deviations"],
    ["Deviations allowed by the plan", String(a.allowedDeviations)],
    ["Sample deviation rate", formatPercent(a.sampleRate, 2), "sample-rate"],
    ...(a.controlFrequency
      ? ([
          [
            "Size set by the firm's control-frequency table",
            `${a.controlFrequency.frequency} → ${a.controlFrequency.minimumSampleSize}`,
            "control-frequency-row",
          ],
          [
            `Upper deviation limit, for information (Clopper–Pearson, one-sided, ${formatPercent(a.confidence, 0)})`,
            formatPercent(a.upperDeviationLimit, 2),
            "upper-deviation-limit",
          ],
        ] as [string, string, string?][])
      : ([
          ["Allowance for sampling risk", formatPercent(a.allowanceForSamplingRisk, 2)],
          [
            a.model === "hypergeometric"
              ? `Upper deviation limit (exact hypergeometric, one-sided: M_U ${a.upperDeviations} of N ${a.populationSize}${a.limitMode === "table" ? ", rounded up to 0.1 point" : ""})`
              : `Upper deviation limit (Clopper–Pearson, one-sided${a.limitMode === "table" ? ", rounded up to 0.1 point" : ""})`,
            formatPercent(a.upperDeviationLimit, 2),
            "upper-deviation-limit",
          ],
          ["Tolerable deviation rate", formatPercent(a.tolerableRate, 2)],
        ] as [string, string, string?][])),
    ...(a.twoStage
      ? ([
          [
            "Two-stage plan: stage 1 size n₁ · stage 2 size n₂",
            `${a.twoStage.firstStageSize} · ${a.twoStage.secondStageSize}`,
          ],
          ["Planned risk of overreliance at the tolerable rate", formatPercent(a.twoStage.riskOfOverreliance, 2)],
          [
            "Deviations in stage 1 · in stage 2",
            `${a.twoStage.firstStageDeviations} · ${a.twoStage.secondStageDeviations ?? "—"}`,
            "two-stage-deviations",
          ],
        ] as [string, string, string?][])
      : []),
  ];
  return (
    <div className="space-y-2">
      <Table label="Attribute result" density="compact">
        <tbody>
          {rows.map(([label, value, id]) => (
            <tr key={label} className="border-t border-ink-line/60">
              <Th scope="row" className="font-normal text-ink-soft">
                {label}
              </Th>
              <Td numeric data-testid={id} className="font-medium">
                {value}
              </Td>
            </tr>
          ))}
        </tbody>
      </Table>
      <p className="text-sm">{a.statement}</p>
    </div>
  );
}
