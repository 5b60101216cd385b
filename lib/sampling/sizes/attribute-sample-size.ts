/**
 * Attribute (tests of controls) sample size, binomial model.
 */
import { binomialCdf } from "../quantiles";
import { requireFiniteNumber, requireObject, requireOpenFraction } from "../validate";
import { EngineInputError } from "../errors";

/** Search limit: sizes beyond this are not practical audit samples. */
export const MAX_ATTRIBUTE_SAMPLE_SIZE = 100000;
const TOLERANCE = 1e-9;

/**
 * Attribute sample size with an expected deviation rate (the AICPA Audit Guide "Audit Sampling"
 * convention, Tables ).
 *
 * The smallest n with BinomialCDF(k; n, tolerableRate) <= 1 − confidence, where
 * k = ceil(expectedRate · n) computed with a 1e-9 tolerance (so 0.0175 × 400 gives 7, not 8), and
 * k = 0 when expectedRate = 0. Because k grows in steps with n the criterion is not monotone, so
 * the search runs upward from the zero-deviation bound ceil(ln β / ln(1 − TDR)) and reports the
 * first n that passes. Large populations only (binomial, no finite-population adjustment).
 *
 * @param o.tolerableRate tolerable deviation rate, in (0, 1).
 * @param o.expectedRate expected deviation rate, in [0, tolerableRate).
 * @param o.confidence 1 − risk of overreliance, in (0, 1).
 * @returns sampleSize n and allowedDeviations k = ceil(expectedRate · n).
 * @throws {TypeError} when a field is not a number.
 * @throws {RangeError} when a rate is out of range, expectedRate >= tolerableRate, or n would exceed 100,000.
 * @example
 * attributeSampleSize({ tolerableRate: 0.05, expectedRate: 0.01, confidence: 0.95 })
 * // → { sampleSize: 93, allowedDeviations: 1 }
 */
export function attributeSampleSize(o: { tolerableRate: number; expectedRate: number; confidence: number }): {
  sampleSize: number;
  allowedDeviations: number;
} {
  requireObject("options", o);
  const tolerableRate = requireOpenFraction("tolerableRate", o.tolerableRate);
  const expectedRate = requireFiniteNumber("expectedRate", o.expectedRate);
  const confidence = requireOpenFraction("confidence", o.confidence);
  if (expectedRate < 0 || expectedRate >= tolerableRate) {
    throw new EngineInputError("expectedRate", `expectedRate must be at least 0 and below tolerableRate (${tolerableRate}) (got ${expectedRate})`,
    );
  }
  const risk = 1 - confidence;
  const start = Math.max(1, Math.ceil(Math.log(risk) / Math.log1p(-tolerableRate) - TOLERANCE));
  for (let n = start; n <= MAX_ATTRIBUTE_SAMPLE_SIZE; n++) {
    const k = expectedRate === 0 ? 0 : Math.ceil(expectedRate * n - TOLERANCE);
    if (k >= n) continue;
    if (binomialCdf(k, n, tolerableRate) <= risk) return { sampleSize: n, allowedDeviations: k };
  }
  throw new EngineInputError("tolerableRate", `no attribute sample size up to ${MAX_ATTRIBUTE_SAMPLE_SIZE} meets tolerableRate ${tolerableRate} with expectedRate ${expectedRate}: raise tolerableRate or lower expectedRate`,
  );
}
