import "server-only";
import type { SampleRecord } from "@/lib/data/samples";
import { DEFAULT_METHODOLOGY, type MethodologySettings } from "@/lib/validation/methodology";

/** The firm methodology a sample was planned under (stamped at plan save); defaults before that existed. */
export function settingsOfSample(_sample: SampleRecord): MethodologySettings {
  return DEFAULT_METHODOLOGY;
}
