import "server-only";
import type { SampleRecord } from "@/lib/data/samples";
import type { MethodologySettings } from "@/lib/validation/methodology";
import { methodologyOfSample } from "./methodology";

/** The firm methodology a sample was planned under (stamped at plan save); defaults before that existed. */
export function settingsOfSample(sample: SampleRecord): MethodologySettings {
  return methodologyOfSample(sample);
}
