import type { SampleRecord } from "@/lib/data/samples";
import type { ClassicalDistribution, FactorMode } from "@/lib/sampling";

export interface EvaluationSettings {
  classicalDistribution: ClassicalDistribution;
  musLimits: "gross" | "net";
  factorMode: FactorMode;
}

/** The methodology settings stamped on the plan that evaluation reads (never the firm's current ones). */
export function evaluationSettingsOf(sample: SampleRecord): EvaluationSettings {
  return { classicalDistribution: "z", musLimits: "gross", factorMode: sample.params.factorMode };
}
