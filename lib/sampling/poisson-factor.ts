/**
 * Poisson confidence (reliability) factors for monetary-unit sampling.
 */
import { gammaQuantile } from "./quantiles";
import { FACTOR_MODES, type FactorMode } from "./types";
import { requireInteger, requireOneOf, requireOpenFraction } from "./validate";

/** Tolerance for "already a whole number of cents" when rounding a factor up (contract: 1e-9). */
const ROUNDING_TOLERANCE = 1e-9;

/**
 * Upper confidence limit of a Poisson mean after `errors` events (the MUS reliability factor).
 *
 * Exact mode: the gamma(errors + 1, scale 1) quantile at `confidence` (equivalently
 * χ²_(confidence; 2(errors+1)) / 2), with the closed form −ln(1 − confidence) for zero errors.
 * Table mode: the exact value rounded UP to 2 decimals, the rule that reproduces the published
 * AICPA-sourced factor table (95%: 3.00, 4.75, 6.30, 7.76; 90%: 2.31, 3.89, 5.33).
 *
 * @param errors number of misstatements, integer 0..10,000.
 * @param confidence 1 − risk of incorrect acceptance, strictly between 0 and 1.
 * @param mode "exact" (default) or "table".
 * @throws {TypeError} when a field is not a number.
 * @throws {RangeError} naming `errors`, `confidence` or `mode` when out of range.
 * @example
 * poissonFactor(1, 0.95)          // → 4.743864518390578
 * poissonFactor(1, 0.95, "table") // → 4.75
 */
export function poissonFactor(errors: number, confidence: number, mode: FactorMode = "exact"): number {
  const k = requireInteger("errors", errors, 0, 10000);
  const c = requireOpenFraction("confidence", confidence);
  const m = requireOneOf("mode", mode, FACTOR_MODES);
  const exact = k === 0 ? -Math.log1p(-c) : gammaQuantile(c, k + 1);
  return m === "exact" ? exact : roundUpToCents(exact);
}

/** Rounds up to 2 decimals, leaving a value within 1e-9 of a 2-decimal number where it is. */
export function roundUpToCents(value: number): number {
  return Math.ceil(value * 100 - ROUNDING_TOLERANCE) / 100;
}

/** Factors RF(0..count-1) at one confidence and mode. */
export function poissonFactors(count: number, confidence: number, mode: FactorMode): number[] {
  const factors: number[] = [];
  for (let k = 0; k < count; k++) factors.push(poissonFactor(k, confidence, mode));
  return factors;
}
