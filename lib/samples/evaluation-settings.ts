import type { SampleRecord } from "@/lib/data/samples";
import type { ClassicalDistribution, FactorMode } from "@/lib/sampling";
import { factorModeOfSample, methodologyOfSample } from "./methodology";

export interface EvaluationSettings {
  classicalDistribution: ClassicalDistribution;
  musLimits: "gross" | "net";
  factorMode: FactorMode;
}

/**
 * The settings evaluation reads: the firm methodology stamped on the plan (never the firm's current
 * settings) for the t/z choice, the gross/net convention and the Poisson factor mode (the mode the size used).
 */
export function evaluationSettingsOf(sample: SampleRecord): EvaluationSettings {
  const m = methodologyOfSample(sample);
  return {
    classicalDistribution: m.classicalDistribution,
    musLimits: m.musLimits,
    factorMode: factorModeOfSample(sample),
  };
}
