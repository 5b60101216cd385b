/**
 * Classical variables evaluation of one simple random sample.
 */
import { formatMoney, formatPercent } from "../format/number";
import { pairedMoments } from "./descriptive";
import { toCents } from "./money";
import { normalQuantile, studentQuantile } from "./quantiles";
import { sampleToCents } from "./sample-input";
import {
  CLASSICAL_DISTRIBUTIONS,
  ESTIMATORS,
  SIDES,
  type ClassicalDistribution,
  type Estimator,
  type SampledItem,
  type Sides,
  type VariablesEvaluation,
} from "./types";
import { estimateTotal } from "./variables-core";
import { requireInteger, requireObject, requireOneOf, requireOpenFraction } from "./validate";
import { EngineInputError } from "./errors";

/** Common practice: difference, ratio and regression estimators need about 20 misstatements. */
export const MIN_MISSTATEMENTS = 20;
/** A ratio bias above this share of the allowance is reported (common practice). */
export const MATERIAL_BIAS_SHARE = 0.1;

/** Normal quantile for the allowance: two-sided at (1 + c)/2, one-sided at c; Student t when `df` is given. */
export function zFor(confidence: number, sides: Sides, df: number | null = null): number {
  const p = sides === "two" ? (1 + confidence) / 2 : confidence;
  return df === null ? normalQuantile(p) : studentQuantile(p, df);
}

/** Common practice: below 30 items the normal approximation of a classical bound is weak. */
export const SMALL_SAMPLE = 30;

/** The "small sample" warning of a classical evaluation. */
export function smallSampleWarning(n: number, distribution: ClassicalDistribution): string {
  return `Only ${n} items in the sample: below ${SMALL_SAMPLE} the normal approximation behind the bound is weak (common practice)${distribution === "z" ? "; the firm may choose Student's t in its methodology settings" : ", even with Student's t"}.`;
}

/** Reads the optional `distribution` option (default "z"). */
export function distributionOption(value: unknown): ClassicalDistribution {
  return value === undefined ? "z" : requireOneOf("distribution", value, CLASSICAL_DISTRIBUTIONS);
}

/** Assembles bounds, allowance and projected misstatement from an estimate in cents. */
export function boundsFrom(
  estimateCents: number,
  varianceCents: number,
  bookCents: number,
  z: number,
  sides: Sides,
): Omit<VariablesEvaluation, "misstatementsInSample" | "warnings" | "zValue" | "distribution" | "degreesOfFreedom"> {
  const standardError = Math.sqrt(varianceCents) / 100;
  const estimate = estimateCents / 100;
  const allowance = z * standardError;
  return {
    estimatedAuditedValue: estimate,
    projectedMisstatement: (bookCents - estimateCents) / 100,
    standardError,
    allowance,
    lowerBound: sides === "upper" ? -Infinity : estimate - allowance,
    upperBound: sides === "lower" ? Infinity : estimate + allowance,
  };
}

/** The "too few misstatements" warning shared by plain and stratified evaluation. */
export function fewMisstatementsWarning(estimator: string, count: number): string {
  return `Only ${count} misstatement${count === 1 ? "" : "s"} in the sample: the ${estimator} estimator's standard error is unreliable with fewer than about ${MIN_MISSTATEMENTS} (common practice); consider mean-per-unit or monetary-unit evaluation.`;
}

/**
 * Classical variables evaluation: estimate of the audited total with a normal-theory bound.
 *
 * Cochran, Sampling Techniques (3rd ed., 1977), f = n/N, finite population correction throughout:
 * - mean-per-unit: Y = N ȳ; v = N² (1 − f) s_y² / n
 * - difference: Y = X + N d̄ (d = y − x); v = N² (1 − f) s_d² / n
 * - ratio: R = Σy / Σx; Y = R X; v = N² (1 − f) / n · Σ(y − R x)² / (n − 1) (eq. 6.9, "N form")
 * - regression: Y = N (ȳ + b (X̄ − x̄)); v = N² (1 − f) / n · Σ((y − ȳ) − b (x − x̄))² / (n − 2)
 * z is the normal quantile at (1 + c)/2 for "two" sides, at c for one side — or, with
 * distribution "t", Student's t with n − 1 degrees of freedom (n − 2 for regression); the unused side of a
 * one-sided bound is infinite. Bounds are on the audited value; projectedMisstatement = X − Y.
 * Sums are exact in integer cents; results are not rounded.
 *
 * @throws {TypeError} when a field has the wrong type.
 * @throws {RangeError} naming the field: unknown estimator, sides or distribution, n < 2 (n < 3 for regression),
 *   n > populationSize, a value with more than 2 decimals, zero sample book total (ratio), or
 *   constant sample book values (regression).
 * @example
 * evaluateVariables({ estimator: "difference", populationSize: 500, populationBookValue: 1180000,
 *   sample, confidence: 0.95, sides: "two" })   // the 30-item sample of the tests
 * // → { estimatedAuditedValue: 1153333.33…, standardError: 12162.769…, projectedMisstatement: 26666.66…, … }
 */
export function evaluateVariables(o: {
  estimator: Estimator;
  populationSize: number;
  populationBookValue: number;
  sample: SampledItem[];
  confidence: number;
  sides: Sides;
  distribution?: ClassicalDistribution;
}): VariablesEvaluation & { estimatedRatioBias: number } {
  requireObject("options", o);
  const estimator = requireOneOf("estimator", o.estimator, ESTIMATORS);
  const populationSize = requireInteger("populationSize", o.populationSize, 2, 2 ** 31 - 1);
  const bookCents = toCents("populationBookValue", o.populationBookValue);
  const { book, audited } = sampleToCents("sample", o.sample, estimator === "regression" ? 3 : 2, populationSize);
  const confidence = requireOpenFraction("confidence", o.confidence);
  const sides = requireOneOf("sides", o.sides, SIDES);
  const distribution = distributionOption(o.distribution);
  const m = pairedMoments(book, audited);
  if (estimator === "ratio" && m.sumX === 0)
    throw new EngineInputError("sample", "sample bookValue total must not be zero for the ratio estimator");
  if (estimator === "regression" && !(m.varX > 0))
    throw new EngineInputError("sample", "sample bookValue must vary for the regression estimator");

  const core = estimateTotal(estimator, m, populationSize, bookCents);
  const degreesOfFreedom = m.n - (estimator === "regression" ? 2 : 1);
  const z = zFor(confidence, sides, distribution === "t" ? degreesOfFreedom : null);
  const result = boundsFrom(core.estimate, core.variance, bookCents, z, sides);
  const warnings: string[] = [];
  if (m.n < SMALL_SAMPLE) warnings.push(smallSampleWarning(m.n, distribution));
  if (estimator !== "mean-per-unit" && m.nonZeroDifferences < MIN_MISSTATEMENTS) {
    warnings.push(fewMisstatementsWarning(estimator, m.nonZeroDifferences));
  }
  const bias = core.ratioBias / 100;
  if (estimator === "ratio" && Math.abs(bias) > MATERIAL_BIAS_SHARE * result.allowance) {
    warnings.push(
      `The ratio estimator's estimated bias (${formatMoney(bias)}) exceeds ${formatPercent(MATERIAL_BIAS_SHARE)} of the allowance (${formatMoney(result.allowance)}): enlarge the sample or use the difference estimator.`,
    );
  }
  return {
    ...result,
    misstatementsInSample: m.nonZeroDifferences,
    warnings,
    zValue: z,
    distribution,
    degreesOfFreedom,
    estimatedRatioBias: bias,
  };
}
