/**
 * Hypergeometric distribution function and the small-population attribute searches built on it.
 */

/**
 * Hypergeometric distribution function P(X <= k), X the deviations in a sample of n drawn without
 * replacement from N items of which M deviate (scipy.stats.hypergeom.cdf(k, N, M, n); R
 * phyper(k, M, N − M, n)). Summed term by term: log t_lo = Σ log of the first term's factors,
 * t_(j+1)/t_j = (M − j)(n − j) / ((j + 1)(N − M − n + j + 1)), then a log-sum-exp — no
 * log-gamma differences, so it keeps ~1e-13 relative accuracy at N in the hundreds of thousands.
 * @throws {RangeError} when N, M, n are not integers with 0 <= M <= N, 0 <= n <= N, or k not an integer.
 * @example hypergeometricCdf(0, 100, 5, 45) // → 0.04620… (scipy hypergeom.cdf(0, 100, 5, 45) = 0.046206)
 */
export function hypergeometricCdf(k: number, N: number, M: number, n: number): number {
  if (![N, M, n].every(Number.isInteger) || M < 0 || M > N || n < 0 || n > N) {
    throw new RangeError(`N, M, n must be integers with 0 <= M <= N and 0 <= n <= N (got ${N}, ${M}, ${n})`);
  }
  if (!Number.isInteger(k)) throw new RangeError(`k must be an integer (got ${k})`);
  const lo = Math.max(0, n - (N - M));
  const hi = Math.min(n, M);
  if (k < lo) return 0;
  if (k >= hi) return 1;
  let logTerm = logFirstTerm(N, M, n, lo);
  let maxLog = logTerm;
  const logTerms = new Float64Array(k - lo + 1);
  logTerms[0] = logTerm;
  for (let j = lo; j < k; j++) {
    logTerm += Math.log(((M - j) * (n - j)) / ((j + 1) * (N - M - n + j + 1)));
    logTerms[j - lo + 1] = logTerm;
    if (logTerm > maxLog) maxLog = logTerm;
  }
  let sum = 0;
  for (const t of logTerms) sum += Math.exp(t - maxLog);
  return Math.min(1, Math.exp(maxLog + Math.log(sum)));
}

/** log P(X = lo) for lo = max(0, n − (N − M)), as a sum of log ratios. */
function logFirstTerm(N: number, M: number, n: number, lo: number): number {
  let s = 0;
  if (lo === 0) {
    // C(N − M, n) / C(N, n) = Π_{i<n} (N − M − i) / (N − i)
    for (let i = 0; i < n; i++) s += Math.log1p(-M / (N - i));
    return s;
  }
  // lo = n − (N − M) > 0: every non-deviation is drawn; C(M, lo) / C(N, n) = Π_{i<N−M} (n − i) / (N − i)
  for (let i = 0; i < N - M; i++) s += Math.log((n - i) / (N - i));
  return s;
}

/**
 * Smallest n with P(X <= k(n) | N, M, n) <= risk, searching upward from `start` (the criterion is
 * not monotone when k grows with n), or null when no n up to N qualifies.
 */
export function smallestHypergeometricSize(o: {
  N: number;
  M: number;
  risk: number;
  allowed: (n: number) => number;
  start?: number;
}): { n: number; k: number } | null {
  for (let n = Math.max(1, o.start ?? 1); n <= o.N; n++) {
    const k = o.allowed(n);
    if (k >= n) continue;
    if (hypergeometricCdf(k, o.N, o.M, n) <= o.risk) return { n, k };
  }
  return null;
}

/**
 * Exact upper confidence limit on the number of deviations in the population: the largest M with
 * P(X <= k | N, M, n) > risk (the CDF falls as M grows, so a bisection over M in [k, N − n + k]).
 */
export function hypergeometricUpperDeviations(o: { N: number; n: number; k: number; risk: number }): number {
  let lo = o.k; // P(X <= k | M = k) = 1 > risk
  let hi = o.N - o.n + o.k;
  if (hypergeometricCdf(o.k, o.N, hi, o.n) > o.risk) return hi;
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (hypergeometricCdf(o.k, o.N, mid, o.n) > o.risk) lo = mid;
    else hi = mid;
  }
  return lo;
}
