/**
 * Monetary-unit sample size with the expected-misstatement expansion factor.
 */
import { poissonFactor } from "../poisson-factor";
import { requireObject, requireOpenFraction, requirePositive } from "../validate";
import { EngineInputError } from "../errors";

/**
 * Expansion factors for expected misstatement by confidence (1 − risk of incorrect acceptance),
 * as in the AICPA Audit Guide "Audit Sampling" table — from memory, not verified against the
 * printed Guide: 99% 1.9, 95% 1.6, 90% 1.5, 85% 1.4, 80% 1.3, 75% 1.25, 70% 1.2, 63% 1.15, 50% 1.0.
 */
export const EXPANSION_FACTORS: readonly { confidence: number; factor: number }[] = [
  { confidence: 0.99, factor: 1.9 },
  { confidence: 0.95, factor: 1.6 },
  { confidence: 0.9, factor: 1.5 },
  { confidence: 0.85, factor: 1.4 },
  { confidence: 0.8, factor: 1.3 },
  { confidence: 0.75, factor: 1.25 },
  { confidence: 0.7, factor: 1.2 },
  { confidence: 0.63, factor: 1.15 },
  { confidence: 0.5, factor: 1.0 },
];

/** The tabled expansion factor for `confidence` (within 1e-9), or undefined. */
export function expansionFactorFor(confidence: number): number | undefined {
  return EXPANSION_FACTORS.find((row) => Math.abs(row.confidence - confidence) <= 1e-9)?.factor;
}

/**
 * MUS sample size and sampling interval (AICPA Audit Guide "Audit Sampling" formula).
 *
 * n = ceil(BV · RF / (TM − EM · EF)), with RF the exact Poisson factor for zero misstatements
 * (−ln(1 − confidence)) and EF the expansion factor above; interval = BV / n rounded DOWN to a whole
 * currency unit, which is the interval to select and evaluate with. With EM = 0 and a confidence
 * outside the table, EF is reported as 1 (it does not enter the formula).
 *
 * @throws {TypeError} when a field is not a number.
 * @throws {RangeError} when a value is out of range, the confidence has no tabled expansion factor
 *   while EM > 0, or TM <= EM · EF (no sample size can meet the tolerable misstatement).
 * @example
 * musSampleSize({ bookValue: 2740000, tolerableMisstatement: 90000, expectedMisstatement: 15000, confidence: 0.95 })
 * // → { sampleSize: 125, interval: 21920, reliabilityFactor: 2.995732273553991, expansionFactor: 1.6 }
 */
export function musSampleSize(o: {
  bookValue: number;
  tolerableMisstatement: number;
  expectedMisstatement: number;
  confidence: number;
}): { sampleSize: number; interval: number; reliabilityFactor: number; expansionFactor: number } {
  requireObject("options", o);
  const bookValue = requirePositive("bookValue", o.bookValue);
  const tolerable = requirePositive("tolerableMisstatement", o.tolerableMisstatement);
  const expected = requirePositive("expectedMisstatement", o.expectedMisstatement, true);
  const confidence = requireOpenFraction("confidence", o.confidence);
  if (tolerable > bookValue) {
    throw new EngineInputError("tolerableMisstatement", `tolerableMisstatement (${tolerable}) must not exceed bookValue (${bookValue})`);
  }
  const tabled = expansionFactorFor(confidence);
  if (tabled === undefined && expected > 0) {
    throw new EngineInputError("confidence", `confidence ${confidence} has no tabled expansion factor; use one of ${EXPANSION_FACTORS.map((r) => r.confidence).join(", ")}`,
    );
  }
  const expansionFactor = tabled ?? 1;
  const headroom = tolerable - expected * expansionFactor;
  if (!(headroom > 0)) {
    throw new EngineInputError("tolerableMisstatement", `tolerableMisstatement (${tolerable}) must exceed expectedMisstatement × expansion factor (${expected} × ${expansionFactor} = ${expected * expansionFactor})`,
    );
  }
  const reliabilityFactor = poissonFactor(0, confidence, "exact");
  const sampleSize = Math.ceil((bookValue * reliabilityFactor) / headroom - 1e-9);
  const interval = Math.floor(bookValue / sampleSize + 1e-9);
  if (interval < 1) throw new EngineInputError("bookValue", `bookValue (${bookValue}) is too small for a sampling interval of at least 1`);
  return { sampleSize, interval, reliabilityFactor, expansionFactor };
}
