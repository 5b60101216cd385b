/**
 * Sample moments for the variables estimators, computed from integer cents with the corrected
 * two-pass algorithm (Chan, Golub & LeVeque, "Algorithms for computing the sample variance",
 * The American Statistician 37(3), 1983, eq. 1.7): exact integer sums give the means, and the
 * second pass subtracts the (rounding-sized) sum of deviations. NIST StRD NumAcc data check it.
 */
import { EngineInputError } from "./errors";

/**
 * Arithmetic mean, summed with a second correction pass.
 * @throws {RangeError} when `values` is empty or holds a non-finite number.
 * @example mean([10000001, 10000003, 10000002]) // → 10000002
 */
export function mean(values: ArrayLike<number>): number {
  const n = values.length;
  if (n === 0) throw new EngineInputError("values", "values must not be empty");
  let sum = 0;
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(values[i])) throw new EngineInputError(`values[${i}]`, `values[${i}] must be a finite number`);
    sum += values[i]!;
  }
  const first = sum / n;
  let correction = 0;
  for (let i = 0; i < n; i++) correction += values[i]! - first;
  return first + correction / n;
}

/**
 * Sample standard deviation (divisor n − 1), corrected two-pass algorithm.
 * @throws {RangeError} when fewer than 2 values are given.
 * @example standardDeviation([10000001, 10000003, 10000002]) // → 1
 */
export function standardDeviation(values: ArrayLike<number>): number {
  const n = values.length;
  if (n < 2) throw new EngineInputError("values", "values must hold at least 2 numbers");
  const m = mean(values);
  let sumSquares = 0;
  let sumDeviations = 0;
  for (let i = 0; i < n; i++) {
    const dev = values[i]! - m;
    sumSquares += dev * dev;
    sumDeviations += dev;
  }
  return Math.sqrt(Math.max(0, (sumSquares - (sumDeviations * sumDeviations) / n) / (n - 1)));
}

/** Moments of book values x, audited values y and differences d = y − x, all in cents. */
export interface PairedMoments {
  n: number;
  /** Exact integer-cent totals. */
  sumX: number;
  sumY: number;
  meanX: number;
  meanY: number;
  meanD: number;
  /** Variances and covariances with divisor n − 1 (cents²). */
  varX: number;
  varY: number;
  varD: number;
  covXY: number;
  covXD: number;
  /** Items with y ≠ x. */
  nonZeroDifferences: number;
}

/** Moments of paired integer-cent arrays (n >= 2). */
export function pairedMoments(x: ArrayLike<number>, y: ArrayLike<number>): PairedMoments {
  const n = x.length;
  let sumX = 0;
  let sumY = 0;
  let nonZero = 0;
  for (let i = 0; i < n; i++) {
    sumX += x[i]!;
    sumY += y[i]!;
    if (x[i] !== y[i]) nonZero++;
  }
  if (!Number.isSafeInteger(sumX) || !Number.isSafeInteger(sumY)) {
    throw new EngineInputError("sample", "sample totals exceed the exact range in cents");
  }
  const meanX = sumX / n;
  const meanY = sumY / n;
  const meanD = (sumY - sumX) / n;
  let sxx = 0,
    syy = 0,
    sdd = 0,
    sxy = 0,
    sxd = 0;
  for (let i = 0; i < n; i++) {
    const dx = x[i]! - meanX;
    const dy = y[i]! - meanY;
    const dd = y[i]! - x[i]! - meanD;
    sxx += dx * dx;
    syy += dy * dy;
    sdd += dd * dd;
    sxy += dx * dy;
    sxd += dx * dd;
  }
  const df = n - 1;
  return {
    n,
    sumX,
    sumY,
    meanX,
    meanY,
    meanD,
    varX: sxx / df,
    varY: syy / df,
    varD: sdd / df,
    covXY: sxy / df,
    covXD: sxd / df,
    nonZeroDifferences: nonZero,
  };
}
