/** Section 6 for attribute samples: the upper deviation limit against the tolerable rate. */
import { View } from "@react-pdf/renderer";
import { Callout, SubHead, Table } from "./primitives";
import type { AttributesEvaluationBlock } from "./workpaper-data";
import { formatRate } from "@/lib/format/number";

export function AttributesEvaluation({ e }: { e: AttributesEvaluationBlock }) {
  const rate = (x: number) => formatRate(x, 2);
  if (e.controlFrequency) return <ControlFrequencyEvaluation e={e} row={e.controlFrequency} />;
  const hypergeometric = e.model === "hypergeometric";
  return (
    <View>
      <SubHead>Deviation rates</SubHead>
      <Table
        repeatHeader={false}
        columns={[
          { label: "Measure", flex: 1 },
          { label: "Formula", width: 200 },
          { label: "Value", width: 90, align: "right" },
        ]}
        rows={[
          { cells: ["Confidence (1 − risk of overreliance)", "", formatRate(e.confidence, 0)] },
          { cells: ["Tolerable deviation rate", "TDR", rate(e.tolerableRate)] },
          { cells: ["Expected deviation rate (planning)", "EDR", rate(e.expectedRate)] },
          ...(hypergeometric ? [{ cells: ["Population size", "N", String(e.populationSize)] }] : []),
          { cells: ["Sample size", "n", String(e.sampleSize)] },
          { cells: ["Deviations allowed by the plan", "⌈EDR · n⌉", String(e.allowedDeviations)] },
          { cells: ["Deviations found", "k", String(e.deviations)] },
          { cells: ["Sample deviation rate", "k / n", rate(e.sampleRate)] },
          { cells: ["Allowance for sampling risk", "UDL − k / n", rate(e.allowanceForSamplingRisk)] },
          ...(e.twoStage
            ? [
                {
                  cells: [
                    "Two-stage plan: stage sizes",
                    "n₁ · n₂",
                    `${e.twoStage.firstStageSize} · ${e.twoStage.secondStageSize}`,
                  ],
                },
                {
                  cells: [
                    "Planned risk of overreliance",
                    "b(0; n₁) + b(1; n₁)·(1 − TDR)^n₂",
                    rate(e.twoStage.riskOfOverreliance),
                  ],
                },
                {
                  cells: [
                    "Deviations in stage 1 · stage 2",
                    "k₁ · k₂",
                    `${e.twoStage.firstStageDeviations} · ${e.twoStage.secondStageDeviations ?? "—"}`,
                  ],
                },
              ]
            : []),
          ...(hypergeometric
            ? [
                {
                  cells: [
                    "Population deviations at the limit",
                    "largest M with H(k; N, M, n) > 1 − c",
                    String(e.upperDeviations),
                  ],
                },
              ]
            : []),
          {
            total: true,
            cells: [
              "Upper deviation limit",
              `${hypergeometric ? "M_U / N" : "Beta⁻¹(c; k+1, n−k)"}${e.limitMode === "exact" ? "" : ", rounded up to 0.1 point"}`,
              rate(e.upperDeviationLimit),
            ],
          },
        ]}
      />
      <Callout tone={e.supported ? "note" : "warning"}>{e.statement}</Callout>
    </View>
  );
}

/** A control test sized from the firm's frequency table: the row used, the deviations found, the limit for information. */
function ControlFrequencyEvaluation({
  e,
  row,
}: {
  e: AttributesEvaluationBlock;
  row: { frequency: string; minimumSampleSize: number };
}) {
  return (
    <View>
      <SubHead>Deviations (control-frequency table)</SubHead>
      <Table
        repeatHeader={false}
        columns={[
          { label: "Measure", flex: 1 },
          { label: "Formula", width: 200 },
          { label: "Value", width: 90, align: "right" },
        ]}
        rows={[
          {
            cells: [
              "Row of the firm's control-frequency table",
              "frequency → minimum items",
              `${row.frequency} → ${row.minimumSampleSize}`,
            ],
          },
          { cells: ["Occurrences tested", "n", String(e.sampleSize)] },
          { cells: ["Deviations found (none expected)", "k", String(e.deviations)] },
          {
            total: true,
            cells: [
              "Upper deviation limit, for information",
              `Beta⁻¹(${formatRate(e.confidence, 0)}; k+1, n−k)`,
              formatRate(e.upperDeviationLimit, 2),
            ],
          },
        ]}
      />
      <Callout tone={e.supported ? "note" : "warning"}>{e.statement}</Callout>
    </View>
  );
}
