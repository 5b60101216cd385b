/** Section 6 for attribute samples: the upper deviation limit against the tolerable rate. */
import { View } from "@react-pdf/renderer";
import { formatRate } from "./format";
import { Callout, SubHead, Table } from "./primitives";
import type { AttributesEvaluationBlock } from "./workpaper-data";

export function AttributesEvaluation({ e }: { e: AttributesEvaluationBlock }) {
  const rate = (x: number) => formatRate(x, 2);
  return (
    <View>
      <SubHead>Deviation rates</SubHead>
      <Table
        repeatHeader={false}
        columns={[{ label: "Measure", flex: 1 }, { label: "Formula", width: 200 }, { label: "Value", width: 90, align: "right" }]}
        rows={[
          { cells: ["Confidence (1 − risk of overreliance)", "", formatRate(e.confidence, 0)] },
          { cells: ["Tolerable deviation rate", "TDR", rate(e.tolerableRate)] },
          { cells: ["Expected deviation rate (planning)", "EDR", rate(e.expectedRate)] },
          { cells: ["Sample size", "n", String(e.sampleSize)] },
          { cells: ["Deviations allowed by the plan", "⌈EDR · n⌉", String(e.allowedDeviations)] },
          { cells: ["Deviations found", "k", String(e.deviations)] },
          { cells: ["Sample deviation rate", "k / n", rate(e.sampleRate)] },
          { cells: ["Allowance for sampling risk", "UDL − k / n", rate(e.allowanceForSamplingRisk)] },
          ...(e.twoStage ? [
            { cells: ["Two-stage plan: stage sizes", "n₁ · n₂", `${e.twoStage.firstStageSize} · ${e.twoStage.secondStageSize}`] },
            { cells: ["Planned risk of overreliance", "b(0; n₁) + b(1; n₁)·(1 − TDR)^n₂", rate(e.twoStage.riskOfOverreliance)] },
            { cells: ["Deviations in stage 1 · stage 2", "k₁ · k₂", `${e.twoStage.firstStageDeviations} · ${e.twoStage.secondStageDeviations ?? "—"}`] },
          ] : []),
          { total: true, cells: ["Upper deviation limit", e.limitMode === "exact" ? "Beta⁻¹(c; k+1, n−k)" : "Beta⁻¹(c; k+1, n−k), rounded up to 0.1 point", rate(e.upperDeviationLimit)] },
        ]}
      />
      <Callout tone={e.supported ? "note" : "warning"}>{e.statement}</Callout>
    </View>
  );
}
