/**
 * Attribute (tests of controls) sample size: binomial model, or hypergeometric for a stated population size.
 */
import { smallestHypergeometricSize } from "../hypergeometric";
import { EngineInputError } from "../errors";
import { binomialCdf } from "../quantiles";
import { requireFiniteNumber, requireInteger, requireObject, requireOpenFraction } from "../validate";

/** Search limit: sizes beyond this are not practical audit samples. */
export const MAX_ATTRIBUTE_SAMPLE_SIZE = 100000;
const TOLERANCE = 1e-9;

export interface AttributeSampleSize {
  sampleSize: number;
  allowedDeviations: number;
  model: "binomial" | "hypergeometric";
  /** M = ceil(tolerableRate · N), the deviations assumed in the population (hypergeometric only). */
  populationDeviations?: number;
}

/**
 * Attribute sample size with an expected deviation rate (the AICPA Audit Guide "Audit Sampling"
 * convention, Tables ).
 *
 * The smallest n with BinomialCDF(k; n, tolerableRate) <= 1 − confidence, where
 * k = ceil(expectedRate · n) computed with a 1e-9 tolerance (so 0.0175 × 400 gives 7, not 8), and
 * k = 0 when expectedRate = 0. Because k grows in steps with n the criterion is not monotone, so
 * the search runs upward from the zero-deviation bound ceil(ln β / ln(1 − TDR)) and reports the
 * first n that passes.
 *
 * With `populationSize` N the model is hypergeometric (AICPA Audit Guide, small populations): the
 * population is assumed to hold M = ceil(tolerableRate · N) deviations (1e-9 tolerance) and the size
 * is the smallest n with P(X <= k | N, M, n) <= 1 − confidence, k as above — the exact search, not
 * the finite-population shortcut n_b / (1 + n_b / N), which is anti-conservative for small N.
 *
 * @param o.tolerableRate tolerable deviation rate, in (0, 1).
 * @param o.expectedRate expected deviation rate, in [0, tolerableRate).
 * @param o.confidence 1 − risk of overreliance, in (0, 1).
 * @param o.populationSize optional N (items), an integer 1..2^31 − 1: the hypergeometric model.
 * @returns sampleSize n, allowedDeviations k = ceil(expectedRate · n), the model, and for the
 *   hypergeometric model the assumed populationDeviations M.
 * @throws {TypeError} when a field is not a number.
 * @throws {RangeError} when a rate is out of range, expectedRate >= tolerableRate, or n would exceed
 *   100,000; naming populationSize and tolerableRate when no n up to N meets the risk.
 * @example
 * attributeSampleSize({ tolerableRate: 0.05, expectedRate: 0.01, confidence: 0.95 })
 * // → { sampleSize: 93, allowedDeviations: 1, model: "binomial" }
 * attributeSampleSize({ tolerableRate: 0.05, expectedRate: 0, confidence: 0.95, populationSize: 100 })
 * // → { sampleSize: 45, allowedDeviations: 0, model: "hypergeometric", populationDeviations: 5 }
 */
export function attributeSampleSize(o: {
  tolerableRate: number;
  expectedRate: number;
  confidence: number;
  populationSize?: number;
}): AttributeSampleSize {
  requireObject("options", o);
  const tolerableRate = requireOpenFraction("tolerableRate", o.tolerableRate);
  const expectedRate = requireFiniteNumber("expectedRate", o.expectedRate);
  const confidence = requireOpenFraction("confidence", o.confidence);
  if (expectedRate < 0 || expectedRate >= tolerableRate) {
    throw new EngineInputError(
      "expectedRate",
      `expectedRate must be at least 0 and below tolerableRate (${tolerableRate}) (got ${expectedRate})`,
    );
  }
  const risk = 1 - confidence;
  const allowed = (n: number) => (expectedRate === 0 ? 0 : Math.ceil(expectedRate * n - TOLERANCE));
  if (o.populationSize !== undefined) {
    const N = requireInteger("populationSize", o.populationSize, 1, 2 ** 31 - 1);
    const M = Math.ceil(tolerableRate * N - TOLERANCE);
    const found = smallestHypergeometricSize({ N, M, risk, allowed });
    if (found === null) {
      throw new EngineInputError(
        "tolerableRate",
        `populationSize (${N}) with tolerableRate ${tolerableRate} (${M} deviations assumed) has no sample size meeting confidence ${confidence} with expectedRate ${expectedRate}: raise tolerableRate or lower expectedRate`,
      );
    }
    return { sampleSize: found.n, allowedDeviations: found.k, model: "hypergeometric", populationDeviations: M };
  }
  const start = Math.max(1, Math.ceil(Math.log(risk) / Math.log1p(-tolerableRate) - TOLERANCE));
  for (let n = start; n <= MAX_ATTRIBUTE_SAMPLE_SIZE; n++) {
    const k = allowed(n);
    if (k >= n) continue;
    if (binomialCdf(k, n, tolerableRate) <= risk) return { sampleSize: n, allowedDeviations: k, model: "binomial" };
  }
  throw new EngineInputError(
    "tolerableRate",
    `no attribute sample size up to ${MAX_ATTRIBUTE_SAMPLE_SIZE} meets tolerableRate ${tolerableRate} with expectedRate ${expectedRate}: raise tolerableRate or lower expectedRate`,
  );
}
