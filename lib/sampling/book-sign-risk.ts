/**
 * When the ratio and regression estimators stand on weak ground: zero or negative book values in the
 * frame, and a sample book total that can come near zero.
 */
import { formatCount, formatMoney } from "../format/number";
import { requireArray, requireInteger, requireObject, requirePositive } from "./validate";

/** Share of items at or below zero from which they count as a material part of the frame (common practice). */
export const MATERIAL_NON_POSITIVE_SHARE = 0.05;
/** The sample book total "can come near zero" when its mean is within this many standard errors of zero. */
export const NEAR_ZERO_STANDARD_ERRORS = 3;

export interface BookSignRisk {
  zeroCount: number;
  negativeCount: number;
  negativeTotal: number;
  /** Zero/negative items are at least 5 % of the items, or the credits reach tolerable misstatement. */
  materialShare: boolean;
  /** The expected sample book total is within 3 standard errors of zero at this sample size. */
  nearZeroTotal: boolean;
  warnings: string[];
}

/**
 * The ratio estimator R̂ = ȳ/x̄ (and the regression estimator's slope) is defined whenever the
 * sample's book total is not zero (Cochran 1977 §6.2), so zero and negative items do not stop it —
 * but they make it unstable: its variance approximation assumes x̄ well away from zero, i.e. a small
 * coefficient of variation of x̄ (Cochran §6.3–6.4). This flags the two conditions an auditor should
 * hear about: zero/negative items being a material share (5 % of the items, or credits at least
 * tolerable misstatement — common practice) and a sample mean book value within 3 standard errors
 * of zero, SE = s_x·sqrt((1 − n/N)/n). The usual advice: test credit balances as their own population.
 *
 * @throws {TypeError|RangeError} naming the field for bad input.
 * @example
 * bookSignRisk({ bookValues: [100, 120, -30, 90], sampleSize: 2 }).materialShare // → true (1 of 4 items)
 */
export function bookSignRisk(o: {
  bookValues: ArrayLike<number>;
  sampleSize: number;
  tolerableMisstatement?: number;
}): BookSignRisk {
  requireObject("options", o);
  const values = Array.isArray(o.bookValues) ? requireArray<number>("bookValues", o.bookValues) : o.bookValues;
  const N = values.length;
  const n = requireInteger("sampleSize", o.sampleSize, 1, Math.max(1, N));
  const tolerable =
    o.tolerableMisstatement === undefined
      ? undefined
      : requirePositive("tolerableMisstatement", o.tolerableMisstatement);
  let zeroCount = 0,
    negativeCount = 0,
    negativeTotal = 0,
    sum = 0;
  for (let i = 0; i < N; i++) {
    const v = values[i]!;
    sum += v;
    if (v === 0) zeroCount++;
    else if (v < 0) {
      negativeCount++;
      negativeTotal += v;
    }
  }
  const mean = N > 0 ? sum / N : 0;
  let squares = 0;
  for (let i = 0; i < N; i++) squares += (values[i]! - mean) ** 2;
  const sd = N > 1 ? Math.sqrt(squares / (N - 1)) : 0;
  const standardError = sd * Math.sqrt(Math.max(0, 1 - n / N) / n);
  const nonPositive = zeroCount + negativeCount;
  const materialShare =
    nonPositive > 0 &&
    (nonPositive / Math.max(N, 1) >= MATERIAL_NON_POSITIVE_SHARE ||
      (tolerable !== undefined && -negativeTotal >= tolerable));
  const nearZeroTotal = N > 0 && mean <= NEAR_ZERO_STANDARD_ERRORS * standardError;
  const warnings: string[] = [];
  if (materialShare) {
    warnings.push(
      `${formatCount(nonPositive)} of ${formatCount(N)} items are zero or negative (credits ${formatMoney(Math.abs(negativeTotal))}): a material share for the ratio and regression estimators. Consider testing credit balances as their own population.`,
    );
  }
  if (nearZeroTotal) {
    warnings.push(
      `At n = ${n} the sample's book total can come near zero (mean book value ${formatMoney(mean)} is within ${NEAR_ZERO_STANDARD_ERRORS} standard errors of zero): the ratio and regression estimates become unstable. Test credit balances as their own population, or use the difference or mean-per-unit estimator.`,
    );
  }
  return { zeroCount, negativeCount, negativeTotal, materialShare, nearZeroTotal, warnings };
}
