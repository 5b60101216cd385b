/**
 * The distribution functions the engine relies on, in one place, all from jStat 1.9
 * (https://jstat.github.io). Tests cross-check each against @stdlib's independent implementations.
 */
import { jStat } from "jstat";

/**
 * Standard normal quantile Φ⁻¹(p) (jStat.normal.inv, erfcinv with two Newton steps).
 * @throws {RangeError} when p is not strictly between 0 and 1.
 * @example normalQuantile(0.975) // → 1.959963984540054 (R qnorm(0.975) = 1.9599639845)
 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`p must be strictly between 0 and 1 (got ${p})`);
  return jStat.normal.inv(p, 0, 1);
}

/**
 * Gamma quantile with scale 1: the x with P(Gamma(shape, 1) <= x) = p (jStat.gamma.inv, Halley
 * iterations on the regularised lower incomplete gamma function).
 * @throws {RangeError} when p is not in (0, 1) or shape is not positive.
 * @example gammaQuantile(0.95, 2) // → 4.743864518390578 (R qgamma(0.95, 2) = 4.743865)
 */
export function gammaQuantile(p: number, shape: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`p must be strictly between 0 and 1 (got ${p})`);
  if (!(shape > 0)) throw new RangeError(`shape must be greater than zero (got ${shape})`);
  return jStat.gamma.inv(p, shape, 1);
}

/**
 * Beta quantile: the x with I_x(a, b) = p (jStat.beta.inv, Halley iterations on jStat.ibeta).
 * @throws {RangeError} when p is not in (0, 1) or a parameter is not positive.
 * @example betaQuantile(0.95, 2, 92) // → 0.04999397838800484 (R qbeta(0.95, 2, 92) = 0.04999397839)
 */
export function betaQuantile(p: number, a: number, b: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`p must be strictly between 0 and 1 (got ${p})`);
  if (!(a > 0) || !(b > 0)) throw new RangeError(`a and b must be greater than zero (got ${a}, ${b})`);
  return jStat.beta.inv(p, a, b);
}

/**
 * Binomial distribution function P(X <= k), X ~ Binomial(n, p), by direct summation of the
 * probability terms in log space: log t_0 = n·log(1 - p), log t_(j+1) = log t_j + log((n - j)/(j + 1))
 * + log(p/(1 - p)), then a log-sum-exp. Accurate to about 1e-12 relative for the sizes audit
 * tables use (n up to 20,000). jStat's binomial.cdf rounds its result to 10 decimals and its ibeta
 * carries ~1e-7 relative error at n ≈ 17,000, either of which could flip a comparison with a risk level.
 * @throws {RangeError} when n is not a non-negative integer, k not an integer, or p outside [0, 1].
 * @example binomialCdf(0, 59, 0.05) // → 0.04849452524942... (= 0.95^59)
 */
export function binomialCdf(k: number, n: number, p: number): number {
  if (!Number.isInteger(n) || n < 0) throw new RangeError(`n must be a non-negative integer (got ${n})`);
  if (!Number.isInteger(k)) throw new RangeError(`k must be an integer (got ${k})`);
  if (!(p >= 0 && p <= 1)) throw new RangeError(`p must be between 0 and 1 (got ${p})`);
  if (k < 0) return 0;
  if (k >= n || p === 0) return 1;
  if (p === 1) return 0;
  const logOdds = Math.log(p / (1 - p));
  const logTerms = new Float64Array(k + 1);
  let logTerm = n * Math.log1p(-p);
  let maxLog = logTerm;
  logTerms[0] = logTerm;
  for (let j = 0; j < k; j++) {
    logTerm += Math.log((n - j) / (j + 1)) + logOdds;
    logTerms[j + 1] = logTerm;
    if (logTerm > maxLog) maxLog = logTerm;
  }
  let sum = 0;
  for (let j = 0; j <= k; j++) sum += Math.exp(logTerms[j]! - maxLog);
  return Math.min(1, Math.exp(maxLog + Math.log(sum)));
}

/**
 * Student t quantile: the x with P(T_df <= x) = p (jStat.studentt.inv, through the inverse
 * regularised incomplete beta function; about 2e-8 absolute against scipy at df 9–39).
 * @throws {RangeError} when p is not in (0, 1) or df is not positive.
 * @example studentQuantile(0.975, 39) // → 2.0226909… (scipy.stats.t.ppf(0.975, 39) = 2.022690911734728)
 */
export function studentQuantile(p: number, df: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`p must be strictly between 0 and 1 (got ${p})`);
  if (!(df > 0)) throw new RangeError(`degreesOfFreedom must be greater than zero (got ${df})`);
  return jStat.studentt.inv(p, df);
}
