/**
 * Attribute evaluation: upper deviation limit.
 */
import { betaQuantile } from "./quantiles";
import { requireInteger, requireObject, requireOneOf, requireOpenFraction } from "./validate";

/**
 * One-sided Clopper–Pearson upper limit for a deviation rate (Clopper & Pearson, Biometrika 26,
 * 1934): the beta(k + 1, n − k) quantile at `confidence`, 1 when k = n, and the closed form
 * 1 − (1 − confidence)^(1/n) when k = 0. Mode "table" rounds the limit UP to 0.1 percentage point,
 * the rule of the AICPA Audit Guide's evaluation tables (reproduces e.g. n 65, k 0 → 4.6%).
 *
 * @throws {TypeError} when a field is not a number.
 * @throws {RangeError} naming the field: sampleSize < 1, deviations outside 0..sampleSize,
 *   confidence outside (0, 1), unknown mode.
 * @example
 * evaluateAttributes({ sampleSize: 93, deviations: 1, confidence: 0.95 })
 * // → { sampleRate: 0.010752688172043012, upperLimit: 0.04999397838800484, mode: "exact" }
 */
export function evaluateAttributes(o: {
  sampleSize: number;
  deviations: number;
  confidence: number;
  mode?: "exact" | "table";
}): { sampleRate: number; upperLimit: number; mode: "exact" | "table" } {
  requireObject("options", o);
  const n = requireInteger("sampleSize", o.sampleSize, 1, 2 ** 31 - 1);
  const k = requireInteger("deviations", o.deviations, 0, n);
  const confidence = requireOpenFraction("confidence", o.confidence);
  const mode = o.mode === undefined ? "exact" : requireOneOf("mode", o.mode, ["exact", "table"] as const);
  let upper: number;
  if (k === n) upper = 1;
  else if (k === 0) upper = -Math.expm1(Math.log1p(-confidence) / n);
  else upper = betaQuantile(confidence, k + 1, n - k);
  if (mode === "table") upper = Math.min(1, Math.ceil(upper * 1000 - 1e-9) / 1000);
  return { sampleRate: k / n, upperLimit: upper, mode };
}
