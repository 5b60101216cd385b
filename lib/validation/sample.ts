import { z } from "zod";
import { keysetFields } from "./keyset";
import { moneyInput } from "./engagement";
import { signedMoney } from "./population";
import { MUS_MIN_CONFIDENCE } from "@/lib/sampling/evaluate-mus";
import { CONTROL_FREQUENCIES, RISK_LEVELS } from "./methodology";

export const SAMPLE_METHODS = ["mus", "random", "systematic", "stratified", "attribute", "nonstatistical"] as const;
export type SampleMethod = (typeof SAMPLE_METHODS)[number];
export const VARIABLES_ESTIMATORS = ["mean-per-unit", "difference", "ratio", "regression"] as const;
export const STRATIFIED_ESTIMATORS = ["mean-per-unit", "difference", "separate-ratio", "combined-ratio"] as const;
export const DIRECTIONS = ["overstatement", "understatement", "both"] as const;
/** One set of words for the direction tested: the plan form and summary, the evaluation, the PDF. */
export const DIRECTION_LABELS: Record<(typeof DIRECTIONS)[number], string> = {
  overstatement: "Overstatement",
  understatement: "Understatement",
  both: "Overstatement and understatement",
};
/** Where a classical plan's expected standard deviation comes from (Cochran 1977 ch. 6–7: the spread that matters is the estimator's). */
export const SPREAD_BASES = ["book-values", "prior-sample", "entered"] as const;
export type SpreadBasis = (typeof SPREAD_BASES)[number];
/** Attribute plans: sized statistically, or from the firm's control-frequency table for manual controls. */
export const ATTRIBUTE_MODES = ["statistical", "control-frequency"] as const;
export const CONTROL_FREQUENCY_LABELS: Record<(typeof CONTROL_FREQUENCIES)[number], string> = {
  annual: "Annual",
  quarterly: "Quarterly",
  monthly: "Monthly",
  weekly: "Weekly",
  daily: "Daily",
  "several-times-daily": "Several times a day",
};

/** The classical estimators as the screens, workbook, PDF and audit trail name them. */
export const ESTIMATOR_LABELS: Record<string, string> = {
  "mean-per-unit": "Mean-per-unit",
  difference: "Difference",
  ratio: "Ratio",
  regression: "Regression",
  "separate-ratio": "Separate ratio",
  "combined-ratio": "Combined ratio",
};

export const METHOD_LABELS: Record<SampleMethod, string> = {
  mus: "Monetary-unit (PPS), Stringer bound",
  random: "Simple random, classical variables",
  systematic: "Systematic with random start, classical variables",
  stratified: "Stratified random, classical variables",
  attribute: "Attribute sampling (test of controls)",
  nonstatistical: "Nonstatistical, key items and a projected misstatement",
};

/** Methods whose plans may name key items examined 100 % (MUS has its top stratum instead). */
export const KEY_ITEM_METHODS: readonly SampleMethod[] = ["nonstatistical", "random", "systematic", "stratified"];
export const NONSTATISTICAL_SELECTIONS = ["random", "systematic", "haphazard", "block"] as const;
export const PROJECTION_METHODS = ["ratio", "difference"] as const;
export const SIZING_BASES = ["risk-assessment", "confidence-override"] as const;
/** The assessed risk levels of the assurance-factor table (rows and columns), highest first. */
export const ASSESSED_RISK_LEVELS = RISK_LEVELS;

/** ISA 530 Appendix 4 (sample selection methods, block selection): the paragraph reference is from memory, not checked against the printed standard. */
export const BLOCK_SELECTION_REFUSED =
  "Block selection is not offered: a block of contiguous items is rarely representative, because items next to one another in a population tend to share characteristics that differ from items elsewhere, so a block cannot support a conclusion about the whole (ISA 530, Appendix 4(e)). Choose random, systematic or haphazard selection.";

const keyItemChoice = z.object({
  itemRef: z.string().trim().min(1, "Give the item reference").max(255),
  reason: z.string().trim().min(3, "Say why this item is examined in full").max(2000),
});

const fraction = (label: string, min: number, max: number) =>
  z.coerce
    .number({ error: `${label} must be a number` })
    .min(min, `${label} must be at least ${min * 100}%`)
    .max(max, `${label} must be at most ${max * 100}%`);

/** Upper bounds of book-value bands for stratified samples, ascending; the last band is open. */
const strataBounds = z
  .array(moneyInput)
  .min(1, "Give at least one band boundary")
  .max(9, "At most 10 strata")
  .refine((b) => b.every((v, i) => i === 0 || Number(v) > Number(b[i - 1])), "Band boundaries must increase");

export const SampleParamsSchema = z
  .object({
    method: z.enum(SAMPLE_METHODS, "Choose a sampling method"),
    estimator: z.enum([...VARIABLES_ESTIMATORS, "separate-ratio", "combined-ratio"]).optional(),
    confidence: fraction("Confidence", 0.5, 0.995).default(0.95),
    tolerableMisstatement: moneyInput.optional(),
    expectedMisstatement: moneyInput.default("0.00"),
    riskOfIncorrectRejection: fraction("Risk of incorrect rejection", 0.01, 0.5).default(0.1),
    tolerableRate: fraction("Tolerable deviation rate", 0.005, 0.5).optional(),
    /** Attribute samples: a fixed size, or a planned two-stage plan (stage 2 only after exactly one deviation). */
    attributePlan: z.enum(["fixed", "two-stage"], "Choose a fixed or a two-stage plan").default("fixed"),
    expectedRate: fraction("Expected deviation rate", 0, 0.5).default(0),
    topStratumThreshold: moneyInput.optional(),
    strataBounds: strataBounds.optional(),
    spreadBasis: z.enum(SPREAD_BASES, "Choose where the expected standard deviation comes from").optional(),
    spreadSampleId: z.coerce.number().int().positive("Choose the earlier sample").optional(),
    expectedStdDev: moneyInput.optional(),
    spreadReason: z
      .string()
      .trim()
      .max(2000)
      .optional()
      .transform((v) => (v ? v : undefined)),
    attributeMode: z.enum(ATTRIBUTE_MODES).optional(),
    controlFrequency: z.enum(CONTROL_FREQUENCIES, "Choose how often the control operates").optional(),
    sampleSize: z.coerce.number().int("Whole items only").positive().optional(),
    sizeReason: z
      .string()
      .trim()
      .max(2000)
      .optional()
      .transform((v) => (v ? v : undefined)),
    /** How the confidence (and, for nonstatistical plans, the assurance factor) is set; absent on plans made before issue 15. */
    sizingBasis: z.enum(SIZING_BASES).optional(),
    assessedRisk: z.enum(ASSESSED_RISK_LEVELS, "Choose the assessed risk of material misstatement").optional(),
    otherProceduresRisk: z
      .enum(ASSESSED_RISK_LEVELS, "Choose the risk that other substantive procedures fail to detect")
      .optional(),
    confidenceReason: z
      .string()
      .trim()
      .max(2000)
      .optional()
      .transform((v) => (v ? v : undefined)),
    keyItemThreshold: moneyInput.optional(),
    keyItems: z.array(keyItemChoice).max(500, "At most 500 individually chosen key items").optional(),
    selection: z.enum(NONSTATISTICAL_SELECTIONS, "Choose random, systematic or haphazard selection").optional(),
    projection: z.enum(PROJECTION_METHODS, "Choose the ratio or the difference method").optional(),
  })
  .superRefine((p, ctx) => {
    const need = (field: keyof typeof p, message: string) => {
      if (p[field] === undefined) ctx.addIssue({ code: "custom", path: [field], message });
    };
    if (p.method === "mus" && p.confidence < MUS_MIN_CONFIDENCE)
      ctx.addIssue({
        code: "custom",
        path: ["confidence"],
        message: `At least ${MUS_MIN_CONFIDENCE * 100}% for a monetary-unit sample: below it the reliability factor RF(0) drops under 1 and the Stringer bound's incremental allowance can turn negative`,
      });
    if (p.sizingBasis === "risk-assessment") {
      need("assessedRisk", "Choose the assessed risk of material misstatement");
      need(
        "otherProceduresRisk",
        "Choose the risk that other substantive procedures fail to detect a material misstatement",
      );
    }
    if (p.sizingBasis === "confidence-override" && !p.confidenceReason)
      ctx.addIssue({
        code: "custom",
        path: ["confidenceReason"],
        message: "Say why the confidence is typed rather than taken from the risk assessment",
      });
    if (!KEY_ITEM_METHODS.includes(p.method) && (p.keyItemThreshold !== undefined || (p.keyItems?.length ?? 0) > 0)) {
      ctx.addIssue({
        code: "custom",
        path: ["keyItems"],
        message:
          p.method === "mus"
            ? "Monetary-unit plans set a top-stratum threshold instead of key items"
            : "Key items apply to tests of details only",
      });
    }
    const refs = new Set<string>();
    p.keyItems?.forEach((k, i) => {
      if (refs.has(k.itemRef))
        ctx.addIssue({ code: "custom", path: ["keyItems", i, "itemRef"], message: `${k.itemRef} is listed twice` });
      refs.add(k.itemRef);
    });
    if (p.method === "nonstatistical") {
      need("sizingBasis", "Size the sample from the risk assessment, or type a confidence with a reason");
      need("projection", "Choose how the misstatement is projected: ratio or difference");
      need("selection", "Choose how the items are selected");
      if (p.selection === "block")
        ctx.addIssue({ code: "custom", path: ["selection"], message: BLOCK_SELECTION_REFUSED });
      return;
    }
    if (p.method === "attribute") {
      if (p.attributeMode === "control-frequency") {
        need("controlFrequency", "Choose how often the control operates");
        return;
      }
      need("tolerableRate", "Give the tolerable deviation rate");
      if (p.tolerableRate !== undefined && p.expectedRate >= p.tolerableRate)
        ctx.addIssue({
          code: "custom",
          path: ["expectedRate"],
          message: "The expected deviation rate must be below the tolerable rate",
        });
      return;
    }
    if (p.method === "random" || p.method === "systematic") {
      if (!p.estimator || !(VARIABLES_ESTIMATORS as readonly string[]).includes(p.estimator))
        ctx.addIssue({
          code: "custom",
          path: ["estimator"],
          message: "Choose mean-per-unit, difference, ratio or regression",
        });
    }
    if (p.method === "stratified") {
      if (!p.estimator || !(STRATIFIED_ESTIMATORS as readonly string[]).includes(p.estimator))
        ctx.addIssue({
          code: "custom",
          path: ["estimator"],
          message: "Choose mean-per-unit, difference, separate ratio or combined ratio",
        });
      need("strataBounds", "Give the book-value band boundaries");
    }
    if (p.spreadBasis === "prior-sample")
      need("spreadSampleId", "Choose the earlier sample whose results give the spread");
    if (p.spreadBasis === "entered") {
      need("expectedStdDev", "Enter the expected standard deviation");
      if (p.expectedStdDev !== undefined && !(Number(p.expectedStdDev) > 0))
        ctx.addIssue({
          code: "custom",
          path: ["expectedStdDev"],
          message: "The expected standard deviation must be above zero",
        });
      need("spreadReason", "Say where the entered figure comes from");
    }
  });
export type SampleParamsInput = z.input<typeof SampleParamsSchema>;
export type SampleParams = z.output<typeof SampleParamsSchema>;

export const PlanSampleSchema = z.object({
  populationId: z.coerce.number().int().positive("Choose a population"),
  name: z.string().trim().min(2, "Name the sample").max(200),
  objective: z.string().trim().min(5, "State the objective of the test").max(4000),
  assertion: z.string().trim().min(2, "Name the assertion (e.g. existence, valuation)").max(200),
  direction: z.enum(DIRECTIONS, "Choose overstatement, understatement or both"),
  params: SampleParamsSchema,
});
export type PlanSampleInput = z.input<typeof PlanSampleSchema>;
export type PlanSample = z.output<typeof PlanSampleSchema>;

/** `direction` sizes a classical variables plan with a one-sided z_α when one direction is tested. */
export const PreviewPlanSchema = z.object({
  populationId: PlanSampleSchema.shape.populationId,
  direction: PlanSampleSchema.shape.direction.optional(),
  params: SampleParamsSchema,
});
export type PreviewPlan = z.output<typeof PreviewPlanSchema>;

export const DrawSchema = z.object({
  seed: z.coerce
    .number()
    .int("The seed is a whole number")
    .min(0)
    .max(4294967295, "The seed is at most 4294967295")
    .optional(),
});

export const ExtendSchema = z.object({
  additional: z.coerce.number().int().min(1).max(10_000),
  reason: z.string().trim().min(3, "Say why the sample is extended").max(2000),
});

export const ReplaceItemSchema = z.object({
  reason: z.string().trim().min(3, "Say why the item cannot be used (e.g. voided document)").max(2000),
});

export const ITEM_STATUSES = ["not-started", "done", "not-auditable"] as const;
export const MISSTATEMENT_CAUSES = [
  "cut-off",
  "pricing",
  "calculation",
  "classification",
  "existence",
  "duplicate",
  "omission",
  "other",
] as const;
export const CAUSE_LABELS: Record<(typeof MISSTATEMENT_CAUSES)[number], string> = {
  "cut-off": "Cut-off",
  pricing: "Pricing or rate",
  calculation: "Arithmetic",
  classification: "Classification",
  existence: "Does not exist",
  duplicate: "Recorded twice",
  omission: "Omitted amount",
  other: "Other (describe)",
};

export const SaveResultSchema = z
  .object({
    version: z.coerce.number().int().positive(),
    status: z.enum(ITEM_STATUSES),
    auditedValue: signedMoney(16).nullable().optional(), // DECIMAL(18,2)
    cause: z.enum(MISSTATEMENT_CAUSES).nullable().optional(),
    causeNote: z.string().trim().max(2000).nullable().optional(),
    deviation: z.boolean().nullable().optional(),
    deviationNature: z.string().trim().max(2000).nullable().optional(),
    comment: z.string().trim().max(4000).nullable().optional(),
  })
  .superRefine((r, ctx) => {
    if (r.status === "done" && r.auditedValue == null && r.deviation == null)
      ctx.addIssue({
        code: "custom",
        path: ["auditedValue"],
        message: "Enter the audited value (or the deviation result) before marking the item done",
      });
    if (r.cause === "other" && !r.causeNote)
      ctx.addIssue({ code: "custom", path: ["causeNote"], message: "Describe the cause" });
  });
export type SaveResult = z.output<typeof SaveResultSchema>;

export const SampleItemsQuerySchema = z
  .object({
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(10).max(500).default(50),
    status: z.enum(["all", ...ITEM_STATUSES, "void"]).default("all"),
    q: z.string().trim().max(100).optional(),
    ...keysetFields,
  })
  .refine((q) => [q.after, q.before, q.last || undefined].filter(Boolean).length <= 1, {
    path: ["after"],
    message: "Give one of after, before or last",
  });

export const HaphazardPickSchema = z.object({
  rowNumber: z.coerce
    .number({ error: "Give the item's row number" })
    .int("Give the item's row number")
    .min(1, "Give the item's row number"),
});

export const AnomalySchema = z.object({
  justification: z
    .string()
    .trim()
    .min(20, "Justify the extremely rare circumstances in at least a sentence (20 characters)")
    .max(4000),
});
