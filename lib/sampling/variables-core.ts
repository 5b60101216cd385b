/**
 * The four estimators of the audited total from one simple random sample, in cents.
 * Cochran, Sampling Techniques, 3rd ed. (1977): mean-per-unit and difference (ch. 2, with finite
 * population correction), ratio (eq. 6.9, the "N form" of the variance), linear regression
 * (ch. 7, residual variance with divisor n − 2).
 */
import type { PairedMoments } from "./descriptive";

export type CoreEstimator = "mean-per-unit" | "difference" | "ratio" | "regression";

export interface StratumEstimate {
  /** Estimated audited total, cents. */
  estimate: number;
  /** Estimated variance of the estimate, cents². */
  variance: number;
  /** First-order ratio-estimator bias of the total, cents (0 for the other estimators). */
  ratioBias: number;
}

/**
 * Estimates the audited total of one stratum (or an unstratified population).
 * @param N population size; @param bookCents population book total X in cents.
 */
export function estimateTotal(
  estimator: CoreEstimator,
  m: PairedMoments,
  N: number,
  bookCents: number,
): StratumEstimate {
  const n = m.n;
  const scale = (N * N * (1 - n / N)) / n;
  switch (estimator) {
    case "mean-per-unit":
      return { estimate: N * m.meanY, variance: scale * m.varY, ratioBias: 0 };
    case "difference":
      return { estimate: bookCents + N * m.meanD, variance: scale * m.varD, ratioBias: 0 };
    case "ratio": {
      const R = m.sumY / m.sumX;
      // e = y − R x = d + (1 − R) x, so s_e² = s_d² + (1 − R)² s_x² + 2 (1 − R) s_xd (well conditioned when R ≈ 1).
      const q = 1 - R;
      const varE = Math.max(0, m.varD + q * q * m.varX + 2 * q * m.covXD);
      // First-order bias of R̂ (Cochran 1977 ch. 6; section number from memory), estimated from the sample, times X.
      const biasR = ((1 - n / N) / (n * m.meanX * m.meanX)) * (R * m.varX - (m.varX + m.covXD));
      return { estimate: R * bookCents, variance: scale * varE, ratioBias: biasR * bookCents };
    }
    case "regression": {
      // b = s_xy / s_x² = 1 + s_xd / s_x²; Σe² = (n − 1)(s_d² − s_xd² / s_x²). With constant sampled
      // book values (possible only inside a simulation; evaluateVariables rejects it) b falls back to 1.
      const slopeDefined = m.varX > 0;
      const b = slopeDefined ? 1 + m.covXD / m.varX : 1;
      const explained = slopeDefined ? (m.covXD * m.covXD) / m.varX : 0;
      const residual = Math.max(0, ((n - 1) * (m.varD - explained)) / (n - 2));
      return { estimate: N * (m.meanY + b * (bookCents / N - m.meanX)), variance: scale * residual, ratioBias: 0 };
    }
  }
}
