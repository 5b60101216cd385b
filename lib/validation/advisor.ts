import { z } from "zod";

export const TAINTING_PATTERN_LABELS = {
  "mostly-small": "Mostly small (90% under 10% of book, a few over half)",
  spread: "Spread evenly (0–100% of book)",
  "whole-amount": "Whole amount (item does not exist)",
} as const;
export const TAINTING_PATTERN_KEYS = Object.keys(TAINTING_PATTERN_LABELS) as (keyof typeof TAINTING_PATTERN_LABELS)[];

const percent = (label: string, min: number, max: number) =>
  z.coerce
    .number({ error: `${label} must be a number` })
    .min(min, `${label} must be at least ${min}%`)
    .max(max, `${label} must be at most ${max}%`);

/** What the advisor assumes about the misstatements in the population (percentages as entered). */
export const AdvisorScenarioSchema = z.discriminatedUnion(
  "kind",
  [
    z.object({
      kind: z.literal("pattern"),
      misstatedPercent: percent("The share of items misstated", 0, 100),
      tainting: z.enum(TAINTING_PATTERN_KEYS, "Choose how large the misstatements are"),
      overstatementPercent: percent("The share of overstatements", 0, 100),
    }),
    z.object({
      kind: z.literal("previous-sample"),
      sampleId: z.coerce.number({ error: "Choose an earlier sample" }).int().positive("Choose an earlier sample"),
    }),
  ],
  "Choose how the misstatements are assumed",
);

/** Sample sizes as a list, or as typed in a form ("30, 60, 120"). */
const sizes = z.preprocess(
  (v) => (typeof v === "string" ? v.split(/[\s,;]+/).filter(Boolean) : v),
  z
    .array(
      z.coerce
        .number({ error: "Each sample size must be a number" })
        .int("Sample sizes are whole items")
        .min(3, "Each sample size must be at least 3")
        .max(20_000, "Each sample size must be at most 20,000"),
    )
    .min(1, "Give at least one sample size")
    .max(6, "At most 6 sample sizes")
    .refine((s) => new Set(s).size === s.length, "Give each sample size once"),
);

export const AdvisorRunSchema = z.object({
  scenario: AdvisorScenarioSchema,
  sampleSizes: sizes,
  trials: z.coerce
    .number({ error: "Trials must be a number" })
    .int("Trials are whole numbers")
    .min(200, "At least 200 trials")
    .max(50_000, "At most 50,000 trials")
    .default(10_000),
  seed: z.preprocess(
    (v) => (v === "" || v === null ? undefined : v),
    z.coerce
      .number({ error: "The seed is a whole number" })
      .int("The seed is a whole number")
      .min(0, "The seed is at least 0")
      .max(4294967295, "The seed is at most 4294967295")
      .optional(),
  ),
});
export type AdvisorRunInput = z.input<typeof AdvisorRunSchema>;
export type AdvisorRun = z.output<typeof AdvisorRunSchema>;

/** Keeping a run as the rationale: a reason is required when the run does not simply back the plan (checked on the server). */
export const AdoptAdvisorRunSchema = z.object({
  reason: z
    .string()
    .trim()
    .max(4000, "At most 4,000 characters")
    .optional()
    .transform((v) => (v ? v : undefined)),
});
