import type { SampleMethod } from "./sample";

const SIZING = ["sizingBasis", "assessedRisk", "otherProceduresRisk"];
const KEY_ITEMS = ["keyItemThreshold", "keyItems"];
const SPREAD = ["spreadBasis", "spreadSampleId", "expectedStdDev", "spreadReason"];
const VARIABLES = [
  "estimator",
  "confidence",
  "tolerableMisstatement",
  "expectedMisstatement",
  "riskOfIncorrectRejection",
];

/**
 * The plan parameters a method uses. The plan form sends only these, and the audit trail prints
 * only these (the schema's defaults for other methods' fields are stored too, but mean nothing here).
 */
export function planKeysFor(params: { method?: unknown; attributeMode?: unknown; sizingBasis?: unknown }): string[] {
  const sizing = [...SIZING, ...(params.sizingBasis === "confidence-override" ? ["confidenceReason"] : [])];
  const byMethod: Record<SampleMethod, string[]> = {
    nonstatistical: [
      "confidence",
      "tolerableMisstatement",
      "expectedMisstatement",
      "selection",
      "projection",
      ...KEY_ITEMS,
      ...sizing,
    ],
    mus: ["confidence", "tolerableMisstatement", "expectedMisstatement", "topStratumThreshold", ...sizing],
    attribute:
      params.attributeMode === "control-frequency"
        ? ["attributeMode", "controlFrequency"]
        : ["confidence", "tolerableRate", "expectedRate", "attributePlan", "attributeMode", ...sizing],
    stratified: [...VARIABLES, "strataBounds", ...KEY_ITEMS, ...sizing],
    random: [...VARIABLES, ...SPREAD, ...KEY_ITEMS, ...sizing],
    systematic: [...VARIABLES, ...SPREAD, ...KEY_ITEMS, ...sizing],
  };
  const forMethod = byMethod[params.method as SampleMethod] ?? [];
  return ["method", "sampleSize", "sizeReason", ...forMethod];
}
