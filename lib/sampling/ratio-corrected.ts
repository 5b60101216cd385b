/**
 * Bias-corrected ratio estimators of the audited total, for comparison with the plain ratio
 * estimator in the advisor (Cochran, Sampling Techniques, 3rd ed., 1977, §6.8–6.9). Their bias is
 * zero or of order 1/n², against 1/n for R̂ = ȳ/x̄; their variance is usually larger, which is why the
 * plain ratio estimator is kept in practice when n is moderate. All amounts in cents.
 */
import type { PairedMoments } from "./descriptive";
import { pairedMoments } from "./descriptive";
import { toCents } from "./money";
import type { SampledItem } from "./types";
import { estimateTotal } from "./variables-core";
import { requireArray, requireInteger, requireObject, requirePositive } from "./validate";
import { EngineInputError } from "./errors";

export type CorrectedRatioEstimator = "hartley-ross" | "jackknife-ratio" | "beale-ratio" | "tin-ratio";
export const CORRECTED_RATIO_ESTIMATORS: readonly CorrectedRatioEstimator[] = [
  "hartley-ross",
  "jackknife-ratio",
  "beale-ratio",
  "tin-ratio",
];

/** Per-item quantities the moments do not carry: r̄ = mean of y_i/x_i and the leave-one-out ratios. */
export interface RatioItemStats {
  /** r̄, NaN when a sampled book value is zero (Hartley–Ross is then undefined). */
  meanRatio: number;
  /** Mean of R̂_(−j) = (Σy − y_j)/(Σx − x_j); NaN when some Σx − x_j is zero. */
  jackknifeMean: number;
  /** Σ_j (R̂_(−j) − mean)². */
  jackknifeSquares: number;
}

/** r̄ and the leave-one-out ratios over `x[idx[j]]`, j < n (the sample positions in a frame). */
export function ratioItemStats(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  idx: ArrayLike<number>,
  n: number,
  sumX: number,
  sumY: number,
): RatioItemStats {
  const R = sumY / sumX;
  let ratios = 0,
    shifted = 0,
    shiftedSquares = 0;
  for (let j = 0; j < n; j++) {
    const i = idx[j]!;
    const xi = x[i]!,
      yi = y[i]!;
    ratios += yi / xi;
    const loo = (sumY - yi) / (sumX - xi) - R; // shifted by R̂ to keep the squares well conditioned
    shifted += loo;
    shiftedSquares += loo * loo;
  }
  const jackknifeShift = shifted / n;
  return {
    meanRatio: ratios / n,
    jackknifeMean: R + jackknifeShift,
    jackknifeSquares: Math.max(0, shiftedSquares - n * jackknifeShift * jackknifeShift),
  };
}

/**
 * One corrected estimator's total and variance from the sample moments (cents), N and X = book total.
 *
 * - Hartley–Ross (unbiased ratio-type; Cochran 1977 §6.8; unbiasedness checked by enumeration in the tests):
 *   Ŷ_HR = r̄X + n(N − 1)/(n − 1)·(ȳ − r̄x̄); variance N²(1 − f)/n·(s_y² + r̄²s_x² − 2r̄s_xy)
 *   (the large-sample form with r̄ in place of R̂).
 * - Jackknife (Quenouille; Cochran §6.9 with g = n groups of one): R̂_Q = nR̂ − (n − 1)·mean_j R̂_(−j),
 *   Ŷ = R̂_Q·X; variance X²(1 − f)(n − 1)/n·Σ(R̂_(−j) − mean)² (the jackknife variance).
 * - Beale (Cochran §6.9): R̂_B = R̂(1 + θc_xy)/(1 + θc_xx), θ = (1 − f)/n, c_xy = s_xy/(x̄ȳ), c_xx = s_x²/x̄².
 * - Tin (Cochran §6.9): R̂_T = R̂(1 + θ(c_xy − c_xx)).
 *   Beale and Tin use the ratio estimator's variance (Cochran eq. 6.9): they differ from it by O(1/n²).
 */
export function correctedRatioTotal(
  kind: CorrectedRatioEstimator,
  m: PairedMoments,
  stats: RatioItemStats,
  N: number,
  bookCents: number,
): { estimate: number; variance: number } {
  const n = m.n;
  const f = n / N;
  const R = m.sumY / m.sumX;
  switch (kind) {
    case "hartley-ross": {
      const r = stats.meanRatio;
      const estimate = r * bookCents + ((n * (N - 1)) / (n - 1)) * (m.meanY - r * m.meanX);
      const variance = ((N * N * (1 - f)) / n) * Math.max(0, m.varY + r * r * m.varX - 2 * r * m.covXY);
      return { estimate, variance };
    }
    case "jackknife-ratio": {
      const rq = n * R - (n - 1) * stats.jackknifeMean;
      return {
        estimate: rq * bookCents,
        variance: bookCents * bookCents * (1 - f) * ((n - 1) / n) * stats.jackknifeSquares,
      };
    }
    case "beale-ratio":
    case "tin-ratio": {
      const theta = (1 - f) / n;
      const cxy = m.covXY / (m.meanX * m.meanY);
      const cxx = m.varX / (m.meanX * m.meanX);
      const corrected =
        kind === "beale-ratio" ? (R * (1 + theta * cxy)) / (1 + theta * cxx) : R * (1 + theta * (cxy - cxx));
      return { estimate: corrected * bookCents, variance: estimateTotal("ratio", m, N, bookCents).variance };
    }
  }
}

/**
 * The four corrected estimators of the audited total from one sample, in currency units, beside the
 * plain ratio estimate (null where an estimator is undefined: Hartley–Ross with a zero book value,
 * every ratio form when the sample's book total is zero).
 *
 * @throws {TypeError|RangeError} naming the field: fewer than 2 items, populationSize below the
 *   sample, a non-positive populationBookValue.
 * @example
 * correctedRatioEstimates({ sample, populationSize: 10, populationBookValue: 1000 })["hartley-ross"]
 * // → { estimate: …, standardError: … }
 */
export function correctedRatioEstimates(o: {
  sample: SampledItem[];
  populationSize: number;
  populationBookValue: number;
}): Record<CorrectedRatioEstimator | "ratio", { estimate: number; standardError: number } | null> {
  requireObject("options", o);
  const sample = requireArray<SampledItem>("sample", o.sample);
  if (sample.length < 2)
    throw new EngineInputError("sample", `sample must hold at least 2 items (got ${sample.length})`);
  const N = requireInteger("populationSize", o.populationSize, sample.length, 2 ** 31 - 1);
  const X = toCents("populationBookValue", requirePositive("populationBookValue", o.populationBookValue));
  const x = Float64Array.from(sample, (s, i) => toCents(`sample[${i}].bookValue`, s.bookValue));
  const y = Float64Array.from(sample, (s, i) => toCents(`sample[${i}].auditedValue`, s.auditedValue));
  const m = pairedMoments(x, y);
  const out = {
    ratio: null,
    "hartley-ross": null,
    "jackknife-ratio": null,
    "beale-ratio": null,
    "tin-ratio": null,
  } as Record<CorrectedRatioEstimator | "ratio", { estimate: number; standardError: number } | null>;
  if (m.sumX === 0) return out;
  const idx = Int32Array.from({ length: sample.length }, (_, i) => i);
  const stats = ratioItemStats(x, y, idx, sample.length, m.sumX, m.sumY);
  const inUnits = (r: { estimate: number; variance: number }) =>
    Number.isFinite(r.estimate) ? { estimate: r.estimate / 100, standardError: Math.sqrt(r.variance) / 100 } : null;
  out.ratio = inUnits(estimateTotal("ratio", m, N, X));
  for (const kind of CORRECTED_RATIO_ESTIMATORS) out[kind] = inUnits(correctedRatioTotal(kind, m, stats, N, X));
  return out;
}
