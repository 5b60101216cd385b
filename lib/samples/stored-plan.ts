import "server-only";
import { z } from "zod";
import { MethodologySettingsSchema } from "@/lib/validation/methodology";
import { ASSESSED_RISK_LEVELS, SAMPLE_METHODS } from "@/lib/validation/sample";
import type { SamplePlan } from "./plan";
import type { SelectionInputs } from "./select";

// The shapes of the JSON the plan and the draw store (samples.plan_json, sample_draws.inputs_json),
// checked when read back (lib/data/samples.ts). Optional fields were added by later issues: older
// rows lack them.

const nonstatisticalSettings = MethodologySettingsSchema.shape.nonstatistical.shape;

const PlannedStratumSchema = z.looseObject({
  number: z.number(),
  label: z.string(),
  populationSize: z.number(),
  bookValue: z.string(),
  standardDeviation: z.number(),
  allocation: z.number(),
});

const RiskSizingSchema = z.looseObject({
  basis: z.enum(["risk-assessment", "confidence-override", "typed-confidence"]),
  assessedRisk: z.enum(ASSESSED_RISK_LEVELS).nullable(),
  otherProceduresRisk: z.enum(ASSESSED_RISK_LEVELS).nullable(),
  tableFactor: z.number().nullable(),
  tableConfidence: z.number().nullable(),
  factor: z.number(),
  confidence: z.number(),
  tableVersion: z.number(),
  overrideReason: z.string().nullable(),
});

const KeyItemsPlanSchema = z.looseObject({
  threshold: z.string().nullable(),
  items: z.array(
    z.looseObject({
      rowNumber: z.number(),
      itemRef: z.string(),
      bookValue: z.string(),
      basis: z.enum(["threshold", "chosen"]),
      reason: z.string().nullable(),
    }),
  ),
  count: z.number(),
  total: z.string(),
  remainder: z.looseObject({ count: z.number(), total: z.string() }),
});

const NonstatisticalPlanPartSchema = z.looseObject({
  selection: z.enum(["random", "systematic", "haphazard"]),
  projection: z.enum(["ratio", "difference"]),
  assuranceFactor: z.number(),
  expectedMisstatement: z.string(),
  expectedMisstatementAdjustment: nonstatisticalSettings.expectedMisstatementAdjustment,
  minimumSampleSize: z.number(),
  raisedToMinimum: z.boolean(),
  wellBelow: z.looseObject({ basis: nonstatisticalSettings.wellBelowBasis, share: z.number(), amount: z.string() }),
});

export const StoredSamplePlanSchema = z.looseObject({
  method: z.enum(SAMPLE_METHODS),
  frameSize: z.number(),
  frameTotal: z.string(),
  excluded: z.looseObject({ zeroCount: z.number(), negativeCount: z.number(), negativeTotal: z.string() }).nullable(),
  computedSize: z.number(),
  chosenSize: z.number(),
  formula: z.string(),
  inputs: z.record(z.string(), z.union([z.string(), z.number()])),
  interval: z.number().optional(),
  topStratumThreshold: z.number().optional(),
  topStratum: z.looseObject({ count: z.number(), total: z.string() }).optional(),
  strata: z.array(PlannedStratumSchema).optional(),
  allowedDeviations: z.number().optional(),
  twoStage: z
    .object({
      firstStageSize: z.number(),
      secondStageSize: z.number(),
      riskOfOverreliance: z.number(),
      expectedSampleSize: z.number(),
    })
    .optional(),
  sides: z.enum(["two", "one"]).optional(),
  sizeMethod: MethodologySettingsSchema.shape.musSizeMethod.optional(),
  factorMode: z.enum(["exact", "table"]).optional(),
  model: z.enum(["binomial", "hypergeometric"]).optional(),
  controlFrequencyRow: MethodologySettingsSchema.shape.controlFrequencies.element.optional(),
  spread: z
    .object({
      basis: z.enum(["book-values", "prior-sample", "entered"]),
      value: z.number(),
      symbol: z.string(),
      detail: z.string(),
      warnings: z.array(z.string()),
    })
    .optional(),
  notes: z.array(z.string()).optional(),
  warnings: z.array(z.string()),
  risk: RiskSizingSchema.optional(),
  keyItems: KeyItemsPlanSchema.nullable().optional(),
  nonstatistical: NonstatisticalPlanPartSchema.optional(),
}) satisfies z.ZodType<SamplePlan>;

export const StoredSelectionInputsSchema = z.looseObject({
  method: z.enum(SAMPLE_METHODS),
  frameSize: z.number(),
  ranks: z.number().optional(),
  sampleSize: z.number().optional(),
  interval: z.number().optional(),
  topStratumThreshold: z.number().optional(),
  strataBounds: z.array(z.number()).optional(),
  stratumRanks: z.array(z.number()).optional(),
  keyRows: z.array(z.number()).optional(),
  selection: z.enum(["random", "systematic", "haphazard"]).optional(),
}) satisfies z.ZodType<SelectionInputs>;
