import "server-only";
import type { MethodologySettings } from "@/lib/validation/methodology";
import type { SampleRecord } from "@/lib/data/samples";

/** The methodology a sample is sized and evaluated under: the settings stamped on its plan, never the firm's current ones. */
export function methodologyOfSample(sample: Pick<SampleRecord, "methodology">): MethodologySettings {
  return sample.methodology;
}
