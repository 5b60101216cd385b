/**
 * Planned two-stage attribute samples: stage 1 accepts on 0 deviations and rejects on 2 or more;
 * exactly 1 deviation opens stage 2, which accepts only with 0 further deviations.
 */
import { EngineInputError } from "./errors";
import { requireFiniteNumber, requireInteger, requireObject, requireOpenFraction } from "./validate";

export interface TwoStageAttributePlan {
  firstStageSize: number;
  secondStageSize: number;
  /** P(accept | deviation rate = tolerable rate) = b(0; n₁) + b(1; n₁)·(1 − TDR)^n₂. */
  riskOfOverreliance: number;
  /** n₁ + b(1; n₁, expected rate)·n₂: the items an auditor expects to test. */
  expectedSampleSize: number;
}

export interface TwoStageEvaluation {
  stage: 1 | 2;
  decision: "accept" | "reject" | "continue";
  riskOfOverreliance: number;
}

const TOLERANCE = 1e-12;
/** The largest first stage searched (plans beyond it are not practical audit samples). */
export const MAX_FIRST_STAGE = 20000;

/** b(0; n, p) and b(1; n, p), binomial probabilities of 0 and 1 deviation. */
function noneAndOne(n: number, p: number): [number, number] {
  const none = Math.exp(n * Math.log1p(-p));
  return [none, n === 0 ? 0 : n * p * Math.exp((n - 1) * Math.log1p(-p))];
}

/** Risk of overreliance of the plan (n₁, n₂) at the tolerable rate. */
export function twoStageRisk(n1: number, n2: number, tolerableRate: number): number {
  const [b0, b1] = noneAndOne(n1, tolerableRate);
  return b0 + b1 * Math.exp(n2 * Math.log1p(-tolerableRate));
}

/** The smallest n₂ >= 1 meeting the risk, or null when stage 1 alone already exceeds it. */
function smallestSecondStage(n1: number, tolerableRate: number, risk: number): number | null {
  const [b0, b1] = noneAndOne(n1, tolerableRate);
  if (b0 >= risk - TOLERANCE) return null;
  let n2 = Math.max(1, Math.ceil(Math.log((risk - b0) / b1) / Math.log1p(-tolerableRate)));
  while (n2 > 1 && twoStageRisk(n1, n2 - 1, tolerableRate) <= risk) n2--;
  while (twoStageRisk(n1, n2, tolerableRate) > risk) n2++;
  return n2;
}

function planOf(n1: number, n2: number, tolerableRate: number, expectedRate: number): TwoStageAttributePlan {
  const [, b1Expected] = noneAndOne(n1, expectedRate);
  return {
    firstStageSize: n1,
    secondStageSize: n2,
    riskOfOverreliance: twoStageRisk(n1, n2, tolerableRate),
    expectedSampleSize: n1 + b1Expected * n2,
  };
}

/**
 * Two-stage attribute sampling plan (binomial model at the tolerable deviation rate; the sequential
 * design of Dodge & Romig's double sampling, with acceptance number 0 and rejection number 2 at
 * stage 1 and acceptance number 1 in total — common practice for planned extensions).
 *
 * Risk of overreliance R(n₁, n₂) = b(0; n₁, TDR) + b(1; n₁, TDR)·(1 − TDR)^n₂. For each n₁ the
 * smallest n₂ >= 1 with R <= 1 − confidence; with `firstStageSize` given, that n₂; otherwise, among
 * n₁ from the zero-deviation size up to the first n₁ whose single-stage risk with one deviation
 * allowed already meets the target, the pair with the smallest expected sample size
 * n₁ + b(1; n₁, EDR)·n₂ (ties: the smaller n₁).
 *
 * @throws {TypeError} when a field is not a number.
 * @throws {RangeError} naming the field: a rate outside (0, 1) (expectedRate in [0, TDR)), or a
 *   firstStageSize too small for any second stage to meet the risk (b(0; n₁) >= 1 − confidence).
 * @example
 * twoStageAttributePlan({ tolerableRate: 0.05, expectedRate: 0, confidence: 0.95 })
 * // → { firstStageSize: 59, secondStageSize: 90, riskOfOverreliance: 0.04999…, expectedSampleSize: 59 }
 */
export function twoStageAttributePlan(o: {
  tolerableRate: number;
  expectedRate: number;
  confidence: number;
  firstStageSize?: number;
}): TwoStageAttributePlan {
  requireObject("options", o);
  const tolerableRate = requireOpenFraction("tolerableRate", o.tolerableRate);
  const expectedRate = requireFiniteNumber("expectedRate", o.expectedRate);
  if (expectedRate < 0 || expectedRate >= tolerableRate)
    throw new EngineInputError(
      "expectedRate",
      `expectedRate must be at least 0 and below tolerableRate (${tolerableRate}) (got ${expectedRate})`,
    );
  const risk = 1 - requireOpenFraction("confidence", o.confidence);
  if (o.firstStageSize !== undefined) {
    const n1 = requireInteger("firstStageSize", o.firstStageSize, 1, MAX_FIRST_STAGE);
    const n2 = smallestSecondStage(n1, tolerableRate, risk);
    if (n2 === null)
      throw new EngineInputError(
        "firstStageSize",
        `firstStageSize must exceed ${Math.ceil(Math.log(risk) / Math.log1p(-tolerableRate)) - 1}: with ${n1} items, stage 1 alone leaves a risk of overreliance above ${risk}`,
      );
    return planOf(n1, n2, tolerableRate, expectedRate);
  }
  let best: TwoStageAttributePlan | null = null;
  for (let n1 = 1; n1 <= MAX_FIRST_STAGE; n1++) {
    const n2 = smallestSecondStage(n1, tolerableRate, risk);
    if (n2 === null) continue;
    const plan = planOf(n1, n2, tolerableRate, expectedRate);
    if (!best || plan.expectedSampleSize < best.expectedSampleSize - TOLERANCE) best = plan;
    const [b0, b1] = noneAndOne(n1, tolerableRate);
    if (b0 + b1 <= risk) break; // a larger n₁ is a single-stage plan that accepts one deviation
  }
  if (!best)
    throw new EngineInputError(
      "tolerableRate",
      `tolerableRate ${tolerableRate} needs a first stage above ${MAX_FIRST_STAGE} items`,
    );
  return best;
}

/**
 * Evaluates a two-stage attribute sample against its plan: stage 1 with 0 deviations accepts, with
 * 2 or more rejects, with exactly 1 continues to stage 2; stage 2 accepts only with 0 further
 * deviations. The risk of overreliance is the plan's.
 *
 * @throws {RangeError} naming the field: deviations outside 0..stage size, secondStageDeviations
 *   given when stage 1 did not continue.
 * @example
 * evaluateTwoStageAttributes({ plan, firstStageDeviations: 1 })                            // → { stage: 1, decision: "continue", … }
 * evaluateTwoStageAttributes({ plan, firstStageDeviations: 1, secondStageDeviations: 0 })  // → { stage: 2, decision: "accept", … }
 */
export function evaluateTwoStageAttributes(o: {
  plan: TwoStageAttributePlan;
  firstStageDeviations: number;
  secondStageDeviations?: number;
}): TwoStageEvaluation {
  requireObject("options", o);
  const plan = requireObject("plan", o.plan) as unknown as TwoStageAttributePlan;
  const n1 = requireInteger("plan.firstStageSize", plan.firstStageSize, 1, MAX_FIRST_STAGE);
  const n2 = requireInteger("plan.secondStageSize", plan.secondStageSize, 1, 2 ** 31 - 1);
  const riskOfOverreliance = requireOpenFraction("plan.riskOfOverreliance", plan.riskOfOverreliance);
  const k1 = requireInteger("firstStageDeviations", o.firstStageDeviations, 0, n1);
  if (k1 !== 1) {
    if (o.secondStageDeviations !== undefined)
      throw new EngineInputError(
        "secondStageDeviations",
        `secondStageDeviations must not be given: stage 1 ${k1 === 0 ? "accepted" : "rejected"} with ${k1} deviations`,
      );
    return { stage: 1, decision: k1 === 0 ? "accept" : "reject", riskOfOverreliance };
  }
  if (o.secondStageDeviations === undefined) return { stage: 1, decision: "continue", riskOfOverreliance };
  const k2 = requireInteger("secondStageDeviations", o.secondStageDeviations, 0, n2);
  return { stage: 2, decision: k2 === 0 ? "accept" : "reject", riskOfOverreliance };
}
