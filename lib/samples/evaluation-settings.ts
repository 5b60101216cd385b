import type { SampleRecord } from "@/lib/data/samples";
import type { ClassicalDistribution, FactorMode } from "@/lib/sampling";
import { methodologyOfSample } from "./methodology";

export interface EvaluationSettings {
  classicalDistribution: ClassicalDistribution;
  musLimits: "gross" | "net";
  factorMode: FactorMode;
}

/**
 * The settings evaluation reads: the firm methodology stamped on the plan (never the firm's current
 * settings) for the t/z choice and the gross/net convention; the factor mode the plan itself chose.
 */
export function evaluationSettingsOf(sample: SampleRecord): EvaluationSettings {
  const m = methodologyOfSample(sample);
  return { classicalDistribution: m.classicalDistribution, musLimits: m.musLimits, factorMode: sample.params.factorMode };
}
