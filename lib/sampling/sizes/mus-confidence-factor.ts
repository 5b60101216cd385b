/**
 * Monetary-unit sampling confidence factor R for sample sizes that allow for expected misstatement
 * (the AICPA Audit Guide "Audit Sampling", 2008 and later editions).
 */
import { roundUpToCents } from "../poisson-factor";
import { gammaQuantile } from "../quantiles";
import { EngineInputError } from "../errors";
import { FACTOR_MODES, type FactorMode } from "../types";
import { requireFiniteNumber, requireObject, requireOneOf, requireOpenFraction } from "../validate";

/** Above this R no practical MUS sample exists (n = R·BV/TM would exceed a million units per TM). */
export const MAX_CONFIDENCE_FACTOR = 1e6;
const RELATIVE_TOLERANCE = 1e-12;

/**
 * MUS confidence factor R: the root of R = Γ⁻¹(confidence; shape 1 + R·EM/TM, scale 1).
 *
 * The Guide's presentation (2008 and later) sizes a monetary-unit sample as n = ⌈R·BV/TM⌉: R is the
 * Poisson upper limit whose allowance still leaves room for the expected misstatement, i.e. the
 * gamma quantile at the confidence with shape 1 + (expected number of misstatements in the sample
 * measured in tolerable-misstatement units). With EM/TM = 0 the root is RF(0) = −ln(1 − confidence)
 * (3.00 at 95 % in table mode). "table" rounds R up to 2 decimals — the rule of the printed table
 * (95 %: 3.00, 3.31, 3.68 at ratios 0, 0.05, 0.10; checked against scipy in the tests).
 *
 * The root is bracketed between RF(0) (where R < Γ⁻¹) and an upper point found by doubling (where
 * R > Γ⁻¹, which exists when the ratio is below 1 because the quantile grows like R·EM/TM), then
 * found by the Illinois variant of regula falsi to a relative 1e-12.
 *
 * @param o.confidence 1 − risk of incorrect acceptance, strictly between 0 and 1.
 * @param o.expectedToTolerable EM/TM, at least 0 and below 1.
 * @param o.mode "exact" (default) or "table".
 * @throws {TypeError} when a field is not a number.
 * @throws {RangeError} naming `confidence`, `expectedToTolerable` or `mode` when out of range, and
 *   naming `expectedToTolerable` and `confidence` when no root exists below 1,000,000.
 * @example
 * musConfidenceFactor({ confidence: 0.95, expectedToTolerable: 0.1 })                  // → 3.6750139…
 * musConfidenceFactor({ confidence: 0.95, expectedToTolerable: 0.1, mode: "table" })   // → 3.68
 */
export function musConfidenceFactor(o: { confidence: number; expectedToTolerable: number; mode?: FactorMode }): number {
  requireObject("options", o);
  const confidence = requireOpenFraction("confidence", o.confidence);
  const ratio = requireFiniteNumber("expectedToTolerable", o.expectedToTolerable);
  const mode = o.mode === undefined ? "exact" : requireOneOf("mode", o.mode, FACTOR_MODES);
  if (ratio < 0 || ratio >= 1) {
    throw new EngineInputError(
      "expectedToTolerable",
      `expectedToTolerable must be at least 0 and below 1 (got ${ratio}): expected misstatement must be below tolerable misstatement`,
    );
  }
  const exact = ratio === 0 ? -Math.log1p(-confidence) : solveConfidenceFactor(confidence, ratio);
  return mode === "exact" ? exact : roundUpToCents(exact);
}

function solveConfidenceFactor(confidence: number, ratio: number): number {
  const gap = (r: number) => gammaQuantile(confidence, 1 + r * ratio) - r;
  let lo = -Math.log1p(-confidence);
  let fLo = gap(lo);
  if (fLo <= 0) return lo;
  let hi = Math.max(2 * lo, 1);
  let fHi = gap(hi);
  while (fHi > 0) {
    lo = hi;
    fLo = fHi;
    hi *= 2;
    if (hi > MAX_CONFIDENCE_FACTOR) {
      throw new EngineInputError(
        "expectedToTolerable",
        `expectedToTolerable (${ratio}) at confidence ${confidence} has no confidence factor below ${MAX_CONFIDENCE_FACTOR}: lower the expected misstatement or raise the tolerable misstatement`,
      );
    }
    fHi = gap(hi);
  }
  let side = 0;
  for (let i = 0; i < 200; i++) {
    const r = (lo * fHi - hi * fLo) / (fHi - fLo);
    const f = gap(r);
    if (Math.abs(f) <= RELATIVE_TOLERANCE * r || hi - lo <= RELATIVE_TOLERANCE * r) return r;
    if (f > 0) {
      lo = r;
      fLo = f;
      if (side === 1) fHi /= 2;
      side = 1;
    } else {
      hi = r;
      fHi = f;
      if (side === -1) fLo /= 2;
      side = -1;
    }
  }
  return (lo + hi) / 2;
}
