import "server-only";
import type { MethodologySettings } from "@/lib/validation/methodology";
import type { SampleRecord } from "@/lib/data/samples";
import type { FactorMode } from "@/lib/sampling";

/** The methodology a sample is sized and evaluated under: the settings stamped on its plan, never the firm's current ones. */
export function methodologyOfSample(sample: Pick<SampleRecord, "methodology">): MethodologySettings {
  return sample.methodology;
}

/**
 * The Poisson factor mode of a sample — one mode for the MUS size (R, RF) and the evaluation's
 * factors: the stamped methodology's. A plan saved before plans were stamped (no methodology
 * version) chose its own mode among its parameters, and keeps it.
 */
export function factorModeOfSample(
  sample: Pick<SampleRecord, "methodology" | "methodologyVersion" | "params">,
): FactorMode {
  const legacy = (sample.params as { factorMode?: unknown }).factorMode;
  if (sample.methodologyVersion === null && (legacy === "exact" || legacy === "table")) return legacy;
  return methodologyOfSample(sample).factorMode;
}
