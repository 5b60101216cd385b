/**
 * Monetary-unit sample size: confidence factors (current Guide) or expansion factors (older Guide).
 */
import { poissonFactor } from "../poisson-factor";
import { EngineInputError } from "../errors";
import { FACTOR_MODES, type FactorMode } from "../types";
import { requireObject, requireOneOf, requireOpenFraction, requirePositive } from "../validate";
import { musConfidenceFactor } from "./mus-confidence-factor";

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

export const MUS_SIZE_METHODS = ["confidence-factor", "expansion-factor"] as const;
export type MusSizeMethod = (typeof MUS_SIZE_METHODS)[number];

export interface MusSampleSize {
  sampleSize: number;
  /** BV / n rounded down to a whole currency unit: the interval to select and evaluate with. */
  interval: number;
  method: MusSizeMethod;
  mode: FactorMode;
  /** R with n = ⌈R·BV/TM⌉: the confidence factor, or under the expansion-factor method RF·TM/(TM − EM·EF). */
  confidenceFactor: number;
  /** RF(0) at the confidence in `mode`. */
  reliabilityFactor: number;
  /** The tabled expansion factor (expansion-factor method only; 1 when EM = 0 off the table). */
  expansionFactor?: number;
}

/**
 * MUS sample size and sampling interval (AICPA Audit Guide "Audit Sampling").
 *
 * method "confidence-factor" (default; the Guide's presentation from the 2008 edition on):
 * n = ⌈R·BV/TM⌉ with R = `musConfidenceFactor({ confidence, expectedToTolerable: EM/TM, mode })`.
 * method "expansion-factor" (the older presentation, kept for firms whose methodology uses it):
 * n = ⌈BV·RF/(TM − EM·EF)⌉ with RF = RF(0) in `mode` and EF the expansion factor above (EF is
 * reported as 1 when EM = 0 and the confidence is off the table; it does not enter the formula).
 * Either way interval = BV / n rounded DOWN to a whole currency unit.
 *
 * @throws {TypeError} when a field is not a number.
 * @throws {RangeError} naming the field when a value is out of range; naming expectedMisstatement
 *   and tolerableMisstatement when EM/TM ≥ 1 or no confidence factor exists, when TM <= EM·EF
 *   (expansion-factor), or when the confidence has no tabled expansion factor while EM > 0.
 * @example
 * musSampleSize({ bookValue: 2740000, tolerableMisstatement: 90000, expectedMisstatement: 15000, confidence: 0.95 })
 * // → { sampleSize: 130, interval: 21076, method: "confidence-factor", mode: "exact", reliabilityFactor: 2.9957…, confidenceFactor: 4.2677… }
 * musSampleSize({ …same, method: "expansion-factor" })
 * // → { sampleSize: 125, interval: 21920, method: "expansion-factor", mode: "exact", reliabilityFactor: 2.9957…, expansionFactor: 1.6, … }
 */
export function musSampleSize(o: {
  bookValue: number;
  tolerableMisstatement: number;
  expectedMisstatement: number;
  confidence: number;
  method?: MusSizeMethod;
  mode?: FactorMode;
}): MusSampleSize {
  requireObject("options", o);
  const bookValue = requirePositive("bookValue", o.bookValue);
  const tolerable = requirePositive("tolerableMisstatement", o.tolerableMisstatement);
  const expected = requirePositive("expectedMisstatement", o.expectedMisstatement, true);
  const confidence = requireOpenFraction("confidence", o.confidence);
  const method = o.method === undefined ? "confidence-factor" : requireOneOf("method", o.method, MUS_SIZE_METHODS);
  const mode = o.mode === undefined ? "exact" : requireOneOf("mode", o.mode, FACTOR_MODES);
  if (tolerable > bookValue) {
    throw new EngineInputError(
      "tolerableMisstatement",
      `tolerableMisstatement (${tolerable}) must not exceed bookValue (${bookValue})`,
    );
  }
  const reliabilityFactor = poissonFactor(0, confidence, mode);
  const sized =
    method === "confidence-factor"
      ? byConfidenceFactor(confidence, expected, tolerable, mode, reliabilityFactor)
      : byExpansionFactor(confidence, expected, tolerable, reliabilityFactor);
  const sampleSize = Math.ceil((sized.confidenceFactor * bookValue) / tolerable - 1e-9);
  const interval = Math.floor(bookValue / sampleSize + 1e-9);
  if (interval < 1)
    throw new EngineInputError(
      "bookValue",
      `bookValue (${bookValue}) is too small for a sampling interval of at least 1`,
    );
  return { sampleSize, interval, method, mode, reliabilityFactor, ...sized };
}

function byConfidenceFactor(
  confidence: number,
  expected: number,
  tolerable: number,
  mode: FactorMode,
  reliabilityFactor: number,
) {
  const ratio = expected / tolerable;
  if (ratio >= 1) {
    throw new EngineInputError(
      "expectedMisstatement",
      `expectedMisstatement (${expected}) must be below tolerableMisstatement (${tolerable})`,
    );
  }
  if (ratio === 0) return { confidenceFactor: reliabilityFactor };
  try {
    return { confidenceFactor: musConfidenceFactor({ confidence, expectedToTolerable: ratio, mode }) };
  } catch (err) {
    if (!(err instanceof RangeError)) throw err;
    throw new EngineInputError(
      "expectedMisstatement",
      `expectedMisstatement (${expected}) is too close to tolerableMisstatement (${tolerable}) for a confidence factor at confidence ${confidence}: lower the expected or raise the tolerable misstatement`,
    );
  }
}

function byExpansionFactor(confidence: number, expected: number, tolerable: number, reliabilityFactor: number) {
  const tabled = expansionFactorFor(confidence);
  if (tabled === undefined && expected > 0) {
    throw new EngineInputError(
      "confidence",
      `confidence ${confidence} has no tabled expansion factor; use one of ${EXPANSION_FACTORS.map((r) => r.confidence).join(", ")}`,
    );
  }
  const expansionFactor = tabled ?? 1;
  const headroom = tolerable - expected * expansionFactor;
  if (!(headroom > 0)) {
    throw new EngineInputError(
      "tolerableMisstatement",
      `tolerableMisstatement (${tolerable}) must exceed expectedMisstatement × expansion factor (${expected} × ${expansionFactor} = ${expected * expansionFactor})`,
    );
  }
  return { confidenceFactor: (reliabilityFactor * tolerable) / headroom, expansionFactor };
}
