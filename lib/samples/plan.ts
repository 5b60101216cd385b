import "server-only";
import {
  bookSignRisk,
  twoStageAttributePlan,
  neymanAllocation,
  stratifiedSampleSize,
  variablesSampleSize,
  type FactorMode,
} from "@/lib/sampling";
import { standardDeviation } from "@/lib/sampling/descriptive";
import { centsToDecimal } from "@/lib/money";
import { engineInputError, fieldError } from "@/lib/errors";
import { EngineInputError } from "@/lib/sampling";
import type { MethodologySettings } from "@/lib/validation/methodology";
import { KEY_ITEM_METHODS, type SampleParams } from "@/lib/validation/sample";
import type { Frame } from "./population-frame";
import { stratifyFrame } from "./strata";
import { planMus } from "./plan-mus";
import { planAttribute } from "./plan-attribute";
import { resolveSpread, type PriorSpread, type SpreadChoice } from "./plan-spread";
import { remainderFrame, resolveKeyItems, type KeyItemsPlan } from "./key-items";
import { riskSizing, type RiskSizing } from "./risk-sizing";
import { planNonstatistical, type NonstatisticalPlanPart } from "./plan-nonstatistical";
import { countOf, formatCount, formatMoney } from "@/lib/format/number";

export interface PlannedStratum {
  number: number;
  label: string;
  populationSize: number;
  bookValue: string;
  standardDeviation: number;
  allocation: number;
}

export interface SamplePlan {
  method: SampleParams["method"];
  frameSize: number;
  frameTotal: string;
  excluded: { zeroCount: number; negativeCount: number; negativeTotal: string } | null;
  computedSize: number;
  chosenSize: number;
  formula: string;
  inputs: Record<string, string | number>;
  interval?: number;
  topStratumThreshold?: number;
  topStratum?: { count: number; total: string };
  strata?: PlannedStratum[];
  allowedDeviations?: number;
  /** Planned two-stage attribute plans: stage 1 of n₁ accepts on 0 deviations, rejects on 2+; exactly 1 opens stage 2 of n₂ (accept on 0 more). */
  twoStage?: {
    firstStageSize: number;
    secondStageSize: number;
    riskOfOverreliance: number;
    expectedSampleSize: number;
  };
  /** Classical variables plans: the sides of z_α the size used — "two" when both directions are
   *  tested, "one" for one direction — stored so that evaluation uses the same (absent: "two"). */
  sides?: "two" | "one";
  /** MUS: the size method and factor mode of the firm's methodology stamped on the plan. */
  sizeMethod?: MethodologySettings["musSizeMethod"];
  factorMode?: FactorMode;
  /** Attribute: the distribution the size (and the evaluation) uses. */
  model?: "binomial" | "hypergeometric";
  /** Attribute plans by control frequency: the firm table's row used. */
  controlFrequencyRow?: MethodologySettings["controlFrequencies"][number];
  /** Classical plans: the expected standard deviation and its basis. */
  spread?: SpreadChoice;
  /** Facts about how the size was reached that are not warnings (e.g. the hypergeometric default). */
  notes?: string[];
  warnings: string[];
  /** How the confidence (and assurance factor) were set: risks, table cell and version, or an override. */
  risk?: RiskSizing;
  /** Key items examined 100 %; the size and the draw are on the remainder. */
  keyItems?: KeyItemsPlan | null;
  nonstatistical?: NonstatisticalPlanPart;
}

export type PlanDirection = "overstatement" | "understatement" | "both";

/**
 * What a plan is sized under besides its own parameters: the firm's methodology (stamped on the plan
 * when saved) and its version (printed on the workpaper beside the assurance factor used).
 */
export interface PlanContext {
  methodology: MethodologySettings;
  methodologyVersion?: number;
  priorSpread?: PriorSpread;
  direction?: PlanDirection;
}

const money = (cents: bigint) => centsToDecimal(cents);

/** Sample size and its computation for a population, as the auditor sees it while planning. */
export function computePlan(
  frame: Frame,
  input: SampleParams,
  performanceMateriality: string,
  context: PlanContext,
): SamplePlan {
  const direction = context.direction ?? "both";
  const tolerable = Number(input.tolerableMisstatement ?? performanceMateriality);
  const expected = Number(input.expectedMisstatement);
  const risk = riskSizing(input, {
    version: context.methodologyVersion ?? 0,
    assuranceFactors: context.methodology.assuranceFactors,
  });
  const params: SampleParams = { ...input, confidence: risk.confidence };
  const keyItems = KEY_ITEM_METHODS.includes(params.method) ? resolveKeyItems(frame, params) : null;
  const sampled = keyItems
    ? remainderFrame(
        frame,
        keyItems.items.map((k) => k.rowNumber),
      ).frame
    : frame;
  const sides = direction === "both" ? "two" : "one";
  const planned = engineCall(params, (): SamplePlan => {
    switch (params.method) {
      case "mus":
        return planMus(frame, params, tolerable, expected, { methodology: context.methodology, direction });
      case "attribute":
        return params.attributePlan === "two-stage"
          ? planTwoStage(frame, params)
          : planAttribute(frame, params, context.methodology);
      case "stratified":
        return planStratified(sampled, params, tolerable, expected, sides);
      case "nonstatistical": {
        const r = planNonstatistical(frame, params, {
          tolerable,
          expected,
          risk,
          keyItems,
          settings: context.methodology.nonstatistical,
        });
        return {
          method: "nonstatistical",
          frameSize: frame.bookValues.length,
          frameTotal: money(frame.totalCents),
          excluded: null,
          computedSize: r.computedSize,
          chosenSize: params.sampleSize ?? r.computedSize,
          formula: r.formula,
          inputs: r.inputs,
          nonstatistical: r.nonstatistical,
          warnings: r.warnings,
        };
      }
      default:
        return planVariables(sampled, params, tolerable, expected, sides, context.priorSpread);
    }
  });
  const plan: SamplePlan = { ...planned, risk, keyItems };
  if (keyItems && params.method !== "nonstatistical")
    plan.warnings = [
      ...plan.warnings,
      `The size is computed on the ${countOf(keyItems.remainder.count, "item")} outside the ${countOf(keyItems.count, "key item")} (book value ${formatMoney(keyItems.remainder.total)}); key items are examined in full and evaluated at their actual misstatement.`,
    ];
  if (keyItems && plan.chosenSize > keyItems.remainder.count) {
    throw fieldError(
      "sampleSize",
      `at most ${countOf(keyItems.remainder.count, "item remains", "items remain")} outside the key items`,
      `At most ${formatCount(keyItems.remainder.count)}`,
    );
  }
  if (params.sampleSize !== undefined && params.sampleSize < plan.computedSize && !params.sizeReason) {
    throw fieldError(
      "sampleSize",
      `${params.sampleSize} is below the computed size ${plan.computedSize}; record the reason to use a smaller sample`,
      `Below the computed size ${plan.computedSize}: give a reason`,
    );
  }
  if (params.sampleSize !== undefined && params.sampleSize > plan.frameSize) {
    throw fieldError(
      "sampleSize",
      `at most ${countOf(plan.frameSize, "item")} can be selected`,
      `At most ${formatCount(plan.frameSize)}`,
    );
  }
  return plan;
}

/**
 * The engine's refusals name the field; they become 400s the planner can read, filed under the
 * plan's own field when the engine's field is one of the parameters sent. Any other error is ours.
 */
function engineCall<T>(params: object, fn: () => T): T {
  try {
    return fn();
  } catch (err) {
    if (err instanceof EngineInputError)
      throw engineInputError(err, { field: err.field in params ? `params.${err.field}` : "params" });
    throw err;
  }
}

const ZA_WORDS = {
  two: "two-sided z_α (both directions tested)",
  one: "one-sided z_α (one direction tested)",
} as const;

function planVariables(
  frame: Frame,
  p: SampleParams,
  tolerable: number,
  expected: number,
  sides: "two" | "one",
  prior?: PriorSpread,
): SamplePlan {
  const N = frame.bookValues.length;
  const spread = resolveSpread(frame, p, prior);
  const r = variablesSampleSize({
    populationSize: N,
    estimatedStdDev: spread.value,
    tolerableMisstatement: tolerable,
    expectedMisstatement: expected,
    riskOfIncorrectAcceptance: 1 - p.confidence,
    riskOfIncorrectRejection: p.riskOfIncorrectRejection,
    sides,
  });
  const chosenSize = p.sampleSize ?? r.sampleSize;
  const signWarnings =
    p.estimator === "ratio" || p.estimator === "regression"
      ? bookSignRisk({
          bookValues: frame.bookValues,
          sampleSize: Math.min(Math.max(chosenSize, 1), N),
          tolerableMisstatement: tolerable,
        }).warnings
      : [];
  return {
    method: p.method,
    frameSize: N,
    sides,
    frameTotal: money(frame.totalCents),
    excluded: null,
    computedSize: r.sampleSize,
    chosenSize,
    formula: `A = (TM − EM) × z_α / (z_α + z_β), ${ZA_WORDS[sides]}; n′ = (N × z_α × ${spread.symbol} / A)²; n = ⌈n′ / (1 + n′/N)⌉ (AICPA classical variables; Cochran 1977 §4.4 finite population correction; ${spread.symbol} the planning spread of the ${p.estimator ?? "mean-per-unit"} estimator, Cochran 1977 ch. 6–7)`,
    inputs: {
      N,
      [spread.symbol]: Number(spread.value.toFixed(2)),
      "spread basis": spread.detail,
      TM: tolerable.toFixed(2),
      EM: expected.toFixed(2),
      "risk of incorrect acceptance": Number((1 - p.confidence).toFixed(4)),
      "risk of incorrect rejection": p.riskOfIncorrectRejection,
      A: Number(r.plannedAllowance.toFixed(2)),
      "n′": Number(r.uncorrectedSampleSizeExact.toFixed(4)),
    },
    spread,
    warnings: [
      ...spread.warnings,
      ...(spread.basis === "book-values"
        ? ["S is estimated from the book values; the audited values' spread may differ."]
        : []),
      ...signWarnings,
    ],
  };
}

function planStratified(
  frame: Frame,
  p: SampleParams,
  tolerable: number,
  expected: number,
  sides: "two" | "one",
): SamplePlan {
  const strata = stratifyFrame(frame, (p.strataBounds ?? []).map(Number));
  const empty = strata.find((s) => s.members.length < 2);
  if (empty)
    throw fieldError(
      "strataBounds",
      `stratum ${empty.number} (${empty.label}) has fewer than 2 items; move its boundaries`,
      `Stratum ${empty.number} has fewer than 2 items`,
    );
  const planning = strata.map((s) => ({
    populationSize: s.members.length,
    standardDeviation: standardDeviation(s.members.map((i) => frame.bookValues[i])),
  }));
  const whole = variablesSampleSize({
    populationSize: frame.bookValues.length,
    estimatedStdDev: Math.max(standardDeviation(frame.bookValues), 0.01),
    tolerableMisstatement: tolerable,
    expectedMisstatement: expected,
    riskOfIncorrectAcceptance: 1 - p.confidence,
    riskOfIncorrectRejection: p.riskOfIncorrectRejection,
    sides,
  });
  const sized = stratifiedSampleSize({
    strata: planning,
    plannedAllowance: whole.plannedAllowance,
    confidence: 1 - p.riskOfIncorrectRejection,
    sides,
  });
  const chosenSize = p.sampleSize ?? sized.sampleSize;
  const allocation =
    chosenSize === sized.sampleSize
      ? sized.allocation
      : neymanAllocation({ strata: planning, sampleSize: chosenSize }).allocation;
  return {
    method: "stratified",
    sides,
    frameSize: frame.bookValues.length,
    frameTotal: money(frame.totalCents),
    excluded: null,
    computedSize: sized.sampleSize,
    chosenSize,
    formula: `Neyman allocation n_h = n × N_h S_h / Σ N_h S_h; n = (Σ N_h S_h)² / ((A / z_α)² + Σ N_h S_h²), ${ZA_WORDS[sides]} (Cochran 1977, ch. 5, Neyman allocation, with the planned allowance A)`,
    inputs: {
      strata: strata.length,
      A: Number(whole.plannedAllowance.toFixed(2)),
      TM: tolerable.toFixed(2),
      EM: expected.toFixed(2),
      "risk of incorrect rejection": p.riskOfIncorrectRejection,
    },
    strata: strata.map((s, h) => ({
      number: s.number,
      label: s.label,
      populationSize: s.members.length,
      bookValue: money(s.bookCents),
      standardDeviation: Number(planning[h].standardDeviation.toFixed(2)),
      allocation: allocation[h],
    })),
    warnings: [
      "Stratum standard deviations are estimated from the book values.",
      ...(p.estimator && p.estimator !== "mean-per-unit"
        ? [
            `The ${p.estimator} estimator's precision depends on the spread of the differences or residuals, not of the book values: this is the mean-per-unit size for the strata.`,
          ]
        : []),
    ],
  };
}

function planTwoStage(frame: Frame, p: SampleParams): SamplePlan {
  const computed = twoStageAttributePlan({
    tolerableRate: p.tolerableRate!,
    expectedRate: p.expectedRate,
    confidence: p.confidence,
  });
  const plan =
    p.sampleSize === undefined
      ? computed
      : twoStageAttributePlan({
          tolerableRate: p.tolerableRate!,
          expectedRate: p.expectedRate,
          confidence: p.confidence,
          firstStageSize: p.sampleSize,
        });
  return {
    method: "attribute",
    frameSize: frame.bookValues.length,
    frameTotal: money(frame.totalCents),
    excluded: null,
    computedSize: computed.firstStageSize,
    chosenSize: plan.firstStageSize,
    allowedDeviations: 0,
    twoStage: plan,
    formula:
      "two-stage: risk of overreliance = b(0; n₁, TDR) + b(1; n₁, TDR) × (1 − TDR)^n₂ ≤ 1 − confidence; for each n₁ the smallest n₂, then the pair with the smallest expected size n₁ + b(1; n₁, EDR) × n₂ (binomial; planned sequential sampling)",
    inputs: {
      TDR: p.tolerableRate!,
      EDR: p.expectedRate,
      confidence: p.confidence,
      "n₁": plan.firstStageSize,
      "n₂": plan.secondStageSize,
      "risk of overreliance": Number(plan.riskOfOverreliance.toFixed(6)),
      "expected size": Number(plan.expectedSampleSize.toFixed(2)),
    },
    warnings: [
      `Stage 1: ${countOf(plan.firstStageSize, "item")}. No deviation: rely on the control. Two or more: do not. Exactly one: draw stage 2 of ${countOf(plan.secondStageSize, "more item", "more items")}, continuing the same random ranking; rely only if none of them deviates.`,
    ],
  };
}
