/**
 * Attribute evaluation: upper deviation limit (binomial, or hypergeometric for a stated population size).
 */
import { hypergeometricUpperDeviations } from "./hypergeometric";
import { betaQuantile } from "./quantiles";
import { requireInteger, requireObject, requireOneOf, requireOpenFraction } from "./validate";

export interface AttributeEvaluation {
  sampleRate: number;
  upperLimit: number;
  mode: "exact" | "table";
  model: "binomial" | "hypergeometric";
  /** M_U, the exact upper limit on the population's deviations (hypergeometric only). */
  upperDeviations?: number;
}

/**
 * One-sided Clopper–Pearson upper limit for a deviation rate (Clopper & Pearson, Biometrika 26,
 * 1934): the beta(k + 1, n − k) quantile at `confidence`, 1 when k = n, and the closed form
 * 1 − (1 − confidence)^(1/n) when k = 0. Mode "table" rounds the limit UP to 0.1 percentage point,
 * the rule of the AICPA Audit Guide's evaluation tables (reproduces e.g. n 65, k 0 → 4.6%).
 *
 * With `populationSize` N the limit is the exact hypergeometric one: M_U, the largest number of
 * deviations in the population with P(X <= k | N, M_U, n) > 1 − confidence, and upperLimit = M_U / N
 * (e.g. N 200, n 59, k 2, 95 % → M_U 18, 9.0 %; scipy.stats.hypergeom in the tests).
 *
 * @throws {TypeError} when a field is not a number.
 * @throws {RangeError} naming the field: sampleSize < 1, deviations outside 0..sampleSize,
 *   confidence outside (0, 1), unknown mode, populationSize below sampleSize.
 * @example
 * evaluateAttributes({ sampleSize: 93, deviations: 1, confidence: 0.95 })
 * // → { sampleRate: 0.010752688172043012, upperLimit: 0.04999397838800484, mode: "exact", model: "binomial" }
 * evaluateAttributes({ sampleSize: 59, deviations: 2, confidence: 0.95, populationSize: 200 })
 * // → { sampleRate: 0.0338…, upperLimit: 0.09, mode: "exact", model: "hypergeometric", upperDeviations: 18 }
 */
export function evaluateAttributes(o: {
  sampleSize: number;
  deviations: number;
  confidence: number;
  mode?: "exact" | "table";
  populationSize?: number;
}): AttributeEvaluation {
  requireObject("options", o);
  const n = requireInteger("sampleSize", o.sampleSize, 1, 2 ** 31 - 1);
  const k = requireInteger("deviations", o.deviations, 0, n);
  const confidence = requireOpenFraction("confidence", o.confidence);
  const mode = o.mode === undefined ? "exact" : requireOneOf("mode", o.mode, ["exact", "table"] as const);
  if (o.populationSize !== undefined) {
    const N = requireInteger("populationSize", o.populationSize, n, 2 ** 31 - 1);
    const upperDeviations = hypergeometricUpperDeviations({ N, n, k, risk: 1 - confidence });
    let rate = upperDeviations / N;
    if (mode === "table") rate = Math.min(1, Math.ceil(rate * 1000 - 1e-9) / 1000);
    return { sampleRate: k / n, upperLimit: rate, mode, model: "hypergeometric", upperDeviations };
  }
  let upper: number;
  if (k === n) upper = 1;
  else if (k === 0) upper = -Math.expm1(Math.log1p(-confidence) / n);
  else upper = betaQuantile(confidence, k + 1, n - k);
  if (mode === "table") upper = Math.min(1, Math.ceil(upper * 1000 - 1e-9) / 1000);
  return { sampleRate: k / n, upperLimit: upper, mode, model: "binomial" };
}
