import "server-only";
import {
  attributeSampleSize, twoStageAttributePlan, musSampleSize, neymanAllocation, stratifiedSampleSize, variablesSampleSize,
} from "@/lib/sampling";
import { standardDeviation } from "@/lib/sampling/descriptive";
import { centsToDecimal } from "@/lib/money";
import { engineInputError, fieldError } from "@/lib/errors";
import { EngineInputError } from "@/lib/sampling";
import type { SampleParams } from "@/lib/validation/sample";
import type { Frame } from "./population-frame";
import { stratifyFrame } from "./strata";
import { MUS_UNDERSTATEMENT_CAUTION } from "./evaluation-words";

export interface PlannedStratum { number: number; label: string; populationSize: number; bookValue: string; standardDeviation: number; allocation: number }

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
  twoStage?: { firstStageSize: number; secondStageSize: number; riskOfOverreliance: number; expectedSampleSize: number };
  /** Classical variables plans: the sides of z_α the size used — "two" when both directions are
   *  tested, "one" for one direction — stored so that evaluation uses the same (absent: "two"). */
  sides?: "two" | "one";
  warnings: string[];
}

export type PlanDirection = "overstatement" | "understatement" | "both";

const money = (cents: bigint) => centsToDecimal(cents);

/** Sample size and its computation for a population, as the auditor sees it while planning. */
export function computePlan(frame: Frame, params: SampleParams, performanceMateriality: string, direction: PlanDirection = "both"): SamplePlan {
  const tolerable = Number(params.tolerableMisstatement ?? performanceMateriality);
  const expected = Number(params.expectedMisstatement);
  const plan = engineCall(params, () => {
    switch (params.method) {
      case "mus": return planMus(frame, params, tolerable, expected, direction);
      case "attribute": return planAttribute(frame, params);
      case "stratified": return planStratified(frame, params, tolerable, expected, direction === "both" ? "two" : "one");
      default: return planVariables(frame, params, tolerable, expected, direction === "both" ? "two" : "one");
    }
  });
  if (params.sampleSize !== undefined && params.sampleSize < plan.computedSize && !params.sizeReason) {
    throw fieldError("sampleSize", `${params.sampleSize} is below the computed size ${plan.computedSize}; record the reason to use a smaller sample`, `Below the computed size ${plan.computedSize}: give a reason`);
  }
  if (params.sampleSize !== undefined && params.sampleSize > plan.frameSize) {
    throw fieldError("sampleSize", `at most ${plan.frameSize} items can be selected`, `At most ${plan.frameSize}`);
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
    if (err instanceof EngineInputError) throw engineInputError(err, { field: err.field in params ? `params.${err.field}` : "params" });
    throw err;
  }
}

function signSummary(frame: Frame) {
  let zeroCount = 0, negativeCount = 0, negativeCents = 0n, positiveCents = 0n, positiveCount = 0;
  frame.bookCents.forEach((c) => {
    if (c === 0n) zeroCount++;
    else if (c < 0n) { negativeCount++; negativeCents += c; }
    else { positiveCount++; positiveCents += c; }
  });
  return { zeroCount, negativeCount, negativeCents, positiveCount, positiveCents };
}

function planMus(frame: Frame, p: SampleParams, tolerable: number, expected: number, direction: PlanDirection): SamplePlan {
  const s = signSummary(frame);
  const bookValue = Number(money(s.positiveCents));
  const r = musSampleSize({ bookValue, tolerableMisstatement: tolerable, expectedMisstatement: expected, confidence: p.confidence, method: "expansion-factor" });
  const chosenSize = p.sampleSize ?? r.sampleSize;
  const interval = chosenSize === r.sampleSize ? r.interval : Math.floor(bookValue / chosenSize);
  if (interval < 1) throw fieldError("sampleSize", "the sampling interval would be below one currency unit", "Too large for this population");
  const threshold = Number(p.topStratumThreshold ?? interval);
  if (threshold > interval) throw fieldError("topStratumThreshold", `must not exceed the sampling interval (${interval})`, `At most the interval, ${interval}`);
  let topCount = 0, topCents = 0n;
  frame.bookValues.forEach((v, i) => { if (v >= threshold) { topCount++; topCents += frame.bookCents[i]; } });
  return {
    method: "mus", frameSize: s.positiveCount, frameTotal: money(s.positiveCents),
    excluded: { zeroCount: s.zeroCount, negativeCount: s.negativeCount, negativeTotal: money(s.negativeCents) },
    computedSize: r.sampleSize, chosenSize,
    formula: "n = ⌈BV × RF / (TM − EM × EF)⌉; sampling interval J = ⌊BV / n⌋ (AICPA Audit Guide “Audit Sampling”, monetary-unit sampling)",
    inputs: { BV: money(s.positiveCents), TM: tolerable.toFixed(2), EM: expected.toFixed(2), confidence: p.confidence, RF: Number(r.reliabilityFactor.toFixed(6)), EF: r.expansionFactor ?? 1 },
    interval, topStratumThreshold: threshold, topStratum: { count: topCount, total: money(topCents) }, warnings: direction === "overstatement" ? [] : [MUS_UNDERSTATEMENT_CAUTION],
  };
}

const ZA_WORDS = { two: "two-sided z_α (both directions tested)", one: "one-sided z_α (one direction tested)" } as const;

function planVariables(frame: Frame, p: SampleParams, tolerable: number, expected: number, sides: "two" | "one"): SamplePlan {
  const N = frame.bookValues.length;
  const sd = standardDeviation(frame.bookValues);
  const r = variablesSampleSize({ populationSize: N, estimatedStdDev: sd, tolerableMisstatement: tolerable, expectedMisstatement: expected, riskOfIncorrectAcceptance: 1 - p.confidence, riskOfIncorrectRejection: p.riskOfIncorrectRejection, sides });
  return {
    method: p.method, frameSize: N, sides, frameTotal: money(frame.totalCents), excluded: null,
    computedSize: r.sampleSize, chosenSize: p.sampleSize ?? r.sampleSize,
    formula: `A = (TM − EM) × z_α / (z_α + z_β), ${ZA_WORDS[sides]}; n′ = (N × z_α × S / A)²; n = ⌈n′ / (1 + n′/N)⌉ (AICPA classical variables; Cochran 1977 §4.4 finite population correction)`,
    inputs: { N, S: Number(sd.toFixed(2)), TM: tolerable.toFixed(2), EM: expected.toFixed(2), "risk of incorrect acceptance": Number((1 - p.confidence).toFixed(4)), "risk of incorrect rejection": p.riskOfIncorrectRejection, A: Number(r.plannedAllowance.toFixed(2)), "n′": Number(r.uncorrectedSampleSizeExact.toFixed(4)) },
    warnings: ["S is estimated from the book values; the audited values' spread may differ."],
  };
}

function planStratified(frame: Frame, p: SampleParams, tolerable: number, expected: number, sides: "two" | "one"): SamplePlan {
  const strata = stratifyFrame(frame, (p.strataBounds ?? []).map(Number));
  const empty = strata.find((s) => s.members.length < 2);
  if (empty) throw fieldError("strataBounds", `stratum ${empty.number} (${empty.label}) has fewer than 2 items; move its boundaries`, `Stratum ${empty.number} has fewer than 2 items`);
  const planning = strata.map((s) => ({ populationSize: s.members.length, standardDeviation: standardDeviation(s.members.map((i) => frame.bookValues[i])) }));
  const whole = variablesSampleSize({ populationSize: frame.bookValues.length, estimatedStdDev: Math.max(standardDeviation(frame.bookValues), 0.01), tolerableMisstatement: tolerable, expectedMisstatement: expected, riskOfIncorrectAcceptance: 1 - p.confidence, riskOfIncorrectRejection: p.riskOfIncorrectRejection, sides });
  const sized = stratifiedSampleSize({ strata: planning, plannedAllowance: whole.plannedAllowance, confidence: 1 - p.riskOfIncorrectRejection, sides });
  const chosenSize = p.sampleSize ?? sized.sampleSize;
  const allocation = chosenSize === sized.sampleSize ? sized.allocation : neymanAllocation({ strata: planning, sampleSize: chosenSize }).allocation;
  return {
    method: "stratified", sides, frameSize: frame.bookValues.length, frameTotal: money(frame.totalCents), excluded: null,
    computedSize: sized.sampleSize, chosenSize,
    formula: `Neyman allocation n_h = n × N_h S_h / Σ N_h S_h; n = (Σ N_h S_h)² / ((A / z_α)² + Σ N_h S_h²), ${ZA_WORDS[sides]} (Cochran 1977, ch. 5, Neyman allocation, with the planned allowance A)`,
    inputs: { strata: strata.length, A: Number(whole.plannedAllowance.toFixed(2)), TM: tolerable.toFixed(2), EM: expected.toFixed(2), "risk of incorrect rejection": p.riskOfIncorrectRejection },
    strata: strata.map((s, h) => ({ number: s.number, label: s.label, populationSize: s.members.length, bookValue: money(s.bookCents), standardDeviation: Number(planning[h].standardDeviation.toFixed(2)), allocation: allocation[h] })),
    warnings: ["Stratum standard deviations are estimated from the book values."],
  };
}

function planTwoStage(frame: Frame, p: SampleParams): SamplePlan {
  const computed = twoStageAttributePlan({ tolerableRate: p.tolerableRate!, expectedRate: p.expectedRate, confidence: p.confidence });
  const plan = p.sampleSize === undefined ? computed : twoStageAttributePlan({ tolerableRate: p.tolerableRate!, expectedRate: p.expectedRate, confidence: p.confidence, firstStageSize: p.sampleSize });
  return {
    method: "attribute", frameSize: frame.bookValues.length, frameTotal: money(frame.totalCents), excluded: null,
    computedSize: computed.firstStageSize, chosenSize: plan.firstStageSize, allowedDeviations: 0, twoStage: plan,
    formula: "two-stage: risk of overreliance = b(0; n₁, TDR) + b(1; n₁, TDR) × (1 − TDR)^n₂ ≤ 1 − confidence; for each n₁ the smallest n₂, then the pair with the smallest expected size n₁ + b(1; n₁, EDR) × n₂ (binomial; planned sequential sampling)",
    inputs: { TDR: p.tolerableRate!, EDR: p.expectedRate, confidence: p.confidence, "n₁": plan.firstStageSize, "n₂": plan.secondStageSize, "risk of overreliance": Number(plan.riskOfOverreliance.toFixed(6)), "expected size": Number(plan.expectedSampleSize.toFixed(2)) },
    warnings: [`Stage 1: ${plan.firstStageSize} items. No deviation: rely on the control. Two or more: do not. Exactly one: draw stage 2 of ${plan.secondStageSize} more items, continuing the same random ranking; rely only if none of them deviates.`],
  };
}

function planAttribute(frame: Frame, p: SampleParams): SamplePlan {
  if (p.attributePlan === "two-stage") return planTwoStage(frame, p);
  const r = attributeSampleSize({ tolerableRate: p.tolerableRate!, expectedRate: p.expectedRate, confidence: p.confidence });
  return {
    method: "attribute", frameSize: frame.bookValues.length, frameTotal: money(frame.totalCents), excluded: null,
    computedSize: r.sampleSize, chosenSize: p.sampleSize ?? r.sampleSize, allowedDeviations: r.allowedDeviations,
    formula: "smallest n with BinomialCDF(k; n, TDR) ≤ 1 − confidence, k = ⌈EDR × n⌉ (AICPA Audit Guide “Audit Sampling”, Tables A-1/A-2)",
    inputs: { TDR: p.tolerableRate!, EDR: p.expectedRate, confidence: p.confidence, "allowed deviations": r.allowedDeviations },
    warnings: frame.bookValues.length < 10 * r.sampleSize ? ["The population is small beside the sample: the binomial sizes are conservative here."] : [],
  };
}
