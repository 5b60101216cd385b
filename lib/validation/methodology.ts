import { z } from "zod";

/** Levels of the two assessed risks that select an assurance factor (AICPA Audit Guide "Audit Sampling" layout). */
export const RISK_LEVELS = ["maximum", "slightly-below-maximum", "moderate", "low"] as const;
export type RiskLevel = (typeof RISK_LEVELS)[number];
export const RISK_LEVEL_LABELS: Record<RiskLevel, string> = {
  maximum: "Maximum",
  "slightly-below-maximum": "Slightly below maximum",
  moderate: "Moderate",
  low: "Low",
};

/** How often a manual control operates, for control tests sized from the firm's frequency table. */
export const CONTROL_FREQUENCIES = [
  "annual",
  "quarterly",
  "monthly",
  "weekly",
  "daily",
  "several-times-daily",
] as const;
export type ControlFrequency = (typeof CONTROL_FREQUENCIES)[number];

/** Confidence an assurance factor stands for under the Poisson model: 1 − e^(−factor) (3.0 ≈ 95 %, common practice). */
export const confidenceForFactor = (factor: number) => Math.round((1 - Math.exp(-factor)) * 10000) / 10000;

const Cell = z.object({
  factor: z.number().min(0.1, "Assurance factors are at least 0.1").max(10, "Assurance factors are at most 10"),
  confidence: z.number().gt(0, "Confidence must be above 0").lt(1, "Confidence must be below 100 %"),
});
const Row = z.array(Cell).length(RISK_LEVELS.length, `Each row has ${RISK_LEVELS.length} cells`);

export const MethodologySettingsSchema = z.object({
  /** rows: assessed risk of material misstatement; columns: risk that other substantive procedures fail to detect. */
  assuranceFactors: z.array(Row).length(RISK_LEVELS.length, `The table has ${RISK_LEVELS.length} rows`),
  musSizeMethod: z.enum(["confidence-factor", "expansion-factor"]),
  factorMode: z.enum(["exact", "table"]),
  classicalDistribution: z.enum(["z", "t"]),
  musLimits: z.enum(["gross", "net"]),
  controlFrequencies: z
    .array(z.object({ frequency: z.enum(CONTROL_FREQUENCIES), minimumSampleSize: z.number().int().min(1).max(1000) }))
    .min(1, "List at least one control frequency"),
  nonstatistical: z.object({
    expectedMisstatementAdjustment: z.enum(["none", "subtract-from-tolerable"]),
    minimumSampleSize: z.number().int().min(0).max(100000),
    wellBelowBasis: z.enum(["expected-misstatement", "share-of-tolerable"]),
    wellBelowShare: z.number().gt(0).lt(1),
  }),
  anomaliesAllowed: z.boolean(),
  hypergeometricBelow: z.number().int().min(0).max(10_000_000),
});
export type MethodologySettings = z.infer<typeof MethodologySettingsSchema>;

/**
 * Assurance factors as the AICPA Audit Guide "Audit Sampling" lays its nonstatistical table out, as
 * commonly reproduced. Every value here is FROM MEMORY, not checked against the printed Guide: the firm
 * must confirm them against its own methodology before relying on them.
 */
export const DEFAULT_ASSURANCE_FACTORS: readonly (readonly number[])[] = [
  [3.0, 2.7, 2.3, 2.0],
  [2.7, 2.4, 2.1, 1.6],
  [2.3, 2.1, 1.6, 1.2],
  [2.0, 1.6, 1.2, 1.0],
];

/** Minimum sizes for manual controls by frequency: common practice, from memory; the firm sets its own. */
export const DEFAULT_CONTROL_FREQUENCIES: MethodologySettings["controlFrequencies"] = [
  { frequency: "annual", minimumSampleSize: 1 },
  { frequency: "quarterly", minimumSampleSize: 2 },
  { frequency: "monthly", minimumSampleSize: 2 },
  { frequency: "weekly", minimumSampleSize: 5 },
  { frequency: "daily", minimumSampleSize: 20 },
  { frequency: "several-times-daily", minimumSampleSize: 25 },
];

export const DEFAULT_METHODOLOGY: MethodologySettings = {
  assuranceFactors: DEFAULT_ASSURANCE_FACTORS.map((row) =>
    row.map((factor) => ({ factor, confidence: confidenceForFactor(factor) })),
  ),
  musSizeMethod: "confidence-factor",
  factorMode: "exact",
  classicalDistribution: "z",
  musLimits: "gross",
  controlFrequencies: DEFAULT_CONTROL_FREQUENCIES,
  nonstatistical: {
    expectedMisstatementAdjustment: "none",
    minimumSampleSize: 0,
    wellBelowBasis: "expected-misstatement",
    wellBelowShare: 0.5,
  },
  anomaliesAllowed: true,
  hypergeometricBelow: 5000,
};

/** Reads a stored settings object, filling fields added since it was saved with today's defaults. */
export function withMethodologyDefaults(stored: unknown): MethodologySettings {
  const partial = (stored && typeof stored === "object" ? stored : {}) as Partial<MethodologySettings>;
  const merged = {
    ...DEFAULT_METHODOLOGY,
    ...partial,
    nonstatistical: { ...DEFAULT_METHODOLOGY.nonstatistical, ...(partial.nonstatistical ?? {}) },
  };
  const parsed = MethodologySettingsSchema.safeParse(merged);
  return parsed.success ? parsed.data : DEFAULT_METHODOLOGY;
}
