import "server-only";
import { z } from "zod";
import { SIMULATED_ESTIMATORS, TAINTING_PATTERNS } from "@/lib/sampling";
import type { AdvisorRequest } from "@/lib/data/advisor-runs";
import type { AdvisorResult } from "./compute";

// What an advisor run stores (advisor_runs.request_json and result_json), checked when read back.

const estimator = z.enum([...SIMULATED_ESTIMATORS, "stringer"]);

export const StoredAdvisorRequestSchema = z.looseObject({
  scenario: z.discriminatedUnion("kind", [
    z.looseObject({
      kind: z.literal("pattern"),
      misstatedShare: z.number(),
      tainting: z.enum(TAINTING_PATTERNS),
      overstatementShare: z.number(),
    }),
    z.looseObject({ kind: z.literal("observed"), misstatedShare: z.number(), taintings: z.array(z.number()) }),
  ]),
  scenarioSource: z.discriminatedUnion("kind", [
    z.looseObject({ kind: z.literal("pattern") }),
    z.looseObject({
      kind: z.literal("previous-sample"),
      sampleId: z.number(),
      sampleName: z.string(),
      results: z.number(),
    }),
  ]),
  sampleSizes: z.array(z.number()),
  trials: z.number(),
  seed: z.number(),
  seedSource: z.enum(["generated", "entered"]),
  confidence: z.number(),
  sides: z.enum(["two", "upper", "lower"]),
  method: z.string(),
  plannedSize: z.number(),
}) satisfies z.ZodType<AdvisorRequest>;

const PerformanceSchema = z.looseObject({
  meanEstimate: z.number(),
  bias: z.number(),
  standardDeviation: z.number(),
  rmse: z.number(),
  coverage: z.number(),
  meanAllowance: z.number(),
  histogram: z.array(z.looseObject({ from: z.number(), to: z.number(), count: z.number() })),
  undefinedTrials: z.number().optional(),
});

export const StoredAdvisorResultSchema = z.looseObject({
  truth: z.looseObject({
    bookTotal: z.number(),
    auditedTotal: z.number(),
    misstatement: z.number(),
    misstatedItems: z.number(),
    items: z.number(),
  }),
  cells: z.array(
    z.looseObject({
      estimator,
      sampleSize: z.number(),
      performance: PerformanceSchema,
      interval: z.number().optional(),
    }),
  ),
  recommendation: z.looseObject({
    sampleSize: z.number(),
    recommended: estimator.nullable(),
    coverageFloor: z.number(),
    verdicts: z.array(
      z.looseObject({
        estimator,
        verdict: z.enum(["recommended", "wider", "short-coverage", "comparison"]),
        reason: z.string(),
      }),
    ),
    summary: z.string(),
    tradeOff: z.string().nullable(),
  }),
  notes: z.array(z.string()),
}) satisfies z.ZodType<AdvisorResult>;
