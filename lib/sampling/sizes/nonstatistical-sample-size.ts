/**
 * Nonstatistical sample size for a test of details from the assurance factor.
 */
import { EngineInputError } from "../errors";
import { toCents } from "../money";
import { requireInteger, requireObject, requireOneOf, requirePositive } from "../validate";

export const EXPECTED_MISSTATEMENT_ADJUSTMENTS = ["none", "subtract-from-tolerable"] as const;
export type ExpectedMisstatementAdjustment = (typeof EXPECTED_MISSTATEMENT_ADJUSTMENTS)[number];

export interface NonstatisticalSize {
  sampleSize: number;
  /** (BV − key items' BV) ÷ TM′ × factor before rounding up. */
  exactSize: number;
  /** Book value the sample is drawn from: the population less the key items. */
  remainderBookValue: number;
  /** TM, or TM − EM when the firm subtracts the expected misstatement. */
  effectiveTolerable: number;
  /** True when the firm minimum raised the size. */
  raisedToMinimum: boolean;
  warnings: string[];
}

const FACTOR_SCALE = 1_000_000n;

/**
 * Nonstatistical sample size (AICPA Audit Guide "Audit Sampling", nonstatistical sampling chapter —
 * formula as commonly reproduced, from memory): n = ⌈(BV − BV of the key items) ÷ TM × assurance factor⌉.
 *
 * The division is exact: amounts in integer cents and the factor scaled to 1e-6, so a size that is
 * a whole number on paper is never rounded up by a floating-point residue. `expectedMisstatementAdjustment`
 * is the firm's choice: "none" (the Guide's formula; a warning says to raise the size by judgement
 * when EM > 0) or "subtract-from-tolerable" (TM − EM in the denominator; common practice). The
 * firm's `minimumSampleSize` raises a smaller size.
 *
 * @throws {TypeError} when a field is not a number.
 * @throws {EngineInputError} when a value is out of range, the key items exceed the book value, or TM − EM ≤ 0.
 * @example
 * nonstatisticalSampleSize({ bookValue: 1000000, keyItemsBookValue: 300000, tolerableMisstatement: 50000, assuranceFactor: 3 })
 * // → { sampleSize: 42, exactSize: 42, remainderBookValue: 700000, effectiveTolerable: 50000, raisedToMinimum: false, warnings: [] }
 */
export function nonstatisticalSampleSize(o: {
  bookValue: number;
  keyItemsBookValue?: number;
  tolerableMisstatement: number;
  assuranceFactor: number;
  expectedMisstatement?: number;
  expectedMisstatementAdjustment?: ExpectedMisstatementAdjustment;
  minimumSampleSize?: number;
}): NonstatisticalSize {
  requireObject("options", o);
  const book = BigInt(toCents("bookValue", requirePositive("bookValue", o.bookValue)));
  const key = BigInt(
    toCents("keyItemsBookValue", requirePositive("keyItemsBookValue", o.keyItemsBookValue ?? 0, true)),
  );
  const tm = BigInt(
    toCents("tolerableMisstatement", requirePositive("tolerableMisstatement", o.tolerableMisstatement)),
  );
  const em = BigInt(
    toCents("expectedMisstatement", requirePositive("expectedMisstatement", o.expectedMisstatement ?? 0, true)),
  );
  const factor = requirePositive("assuranceFactor", o.assuranceFactor);
  if (factor > 10) throw new EngineInputError("assuranceFactor", `assuranceFactor must be at most 10 (got ${factor})`);
  const adjustment = requireOneOf(
    "expectedMisstatementAdjustment",
    o.expectedMisstatementAdjustment ?? "none",
    EXPECTED_MISSTATEMENT_ADJUSTMENTS,
  );
  const minimum = requireInteger("minimumSampleSize", o.minimumSampleSize ?? 0, 0, 100000);
  if (key > book)
    throw new EngineInputError(
      "keyItemsBookValue",
      `keyItemsBookValue must not exceed bookValue (${o.bookValue}); got ${o.keyItemsBookValue}`,
    );
  const effective = adjustment === "subtract-from-tolerable" ? tm - em : tm;
  if (effective <= 0n)
    throw new EngineInputError(
      "tolerableMisstatement",
      `tolerableMisstatement must exceed expectedMisstatement (${o.expectedMisstatement}) when the firm subtracts it`,
    );
  const remainder = book - key;
  const factorScaled = BigInt(Math.round(factor * Number(FACTOR_SCALE)));
  const numerator = remainder * factorScaled;
  const denominator = effective * FACTOR_SCALE;
  const ceil = remainder === 0n ? 0 : Number((numerator + denominator - 1n) / denominator);
  const raisedToMinimum = remainder > 0n && ceil < minimum;
  const warnings: string[] = [];
  if (adjustment === "none" && em > 0n)
    warnings.push(
      "Expected misstatement is above zero: the formula does not allow for it, so increase the size by judgement (or set the firm to subtract it from tolerable misstatement).",
    );
  if (remainder === 0n) warnings.push("Every item is a key item: nothing is left to sample.");
  return {
    sampleSize: raisedToMinimum ? minimum : ceil,
    exactSize: Number(numerator) / Number(denominator),
    remainderBookValue: Number(remainder) / 100,
    effectiveTolerable: Number(effective) / 100,
    raisedToMinimum,
    warnings,
  };
}
