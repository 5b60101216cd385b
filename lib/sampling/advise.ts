/**
 * The estimator advisor's recommendation: the estimator with the lowest root mean squared error
 * whose bound held the truth often enough, and in plain words why each other one loses.
 */
import type { EstimatorPerformance, SimulatedEstimator } from "./simulate";
import { CORRECTED_RATIO_ESTIMATORS } from "./ratio-corrected";
import { EngineInputError } from "./errors";
import { formatNumber, formatRate } from "../format/number";

export type AdvisedEstimator = SimulatedEstimator | "stringer";
export const ADVISED_ESTIMATOR_LABELS: Record<AdvisedEstimator, string> = {
  "mean-per-unit": "Mean-per-unit",
  difference: "Difference",
  ratio: "Ratio",
  regression: "Regression",
  "hartley-ross": "Hartley–Ross (unbiased ratio-type)",
  "jackknife-ratio": "Jackknife ratio (Quenouille)",
  "beale-ratio": "Beale ratio",
  "tin-ratio": "Tin ratio",
  stringer: "Stringer bound (PPS)",
};

/** Shown for comparison only: the evaluation does not offer them, so they are never recommended. */
export const isComparisonEstimator = (e: AdvisedEstimator) =>
  (CORRECTED_RATIO_ESTIMATORS as readonly string[]).includes(e);

export interface AdvisorCell {
  estimator: AdvisedEstimator;
  sampleSize: number;
  performance: EstimatorPerformance;
}

export interface Verdict {
  estimator: AdvisedEstimator;
  verdict: "recommended" | "wider" | "short-coverage" | "comparison";
  reason: string;
}

export interface Recommendation {
  /** The sample size the recommendation is made at (the plan's, when it was simulated). */
  sampleSize: number;
  recommended: AdvisedEstimator | null;
  /** Coverage below this counts as short: the confidence less two Monte Carlo standard errors. */
  coverageFloor: number;
  verdicts: Verdict[];
  summary: string;
  /** Plain words on the bias–variance trade-off when a corrected ratio estimator is less biased but worse on RMSE. */
  tradeOff: string | null;
}

/** Differences seen in the sample below which difference-type estimators are unreliable (common practice). */
export const FEW_DIFFERENCES = 10;
const DIFFERENCE_TYPE: AdvisedEstimator[] = ["difference", "ratio", "regression"];

const pct = (v: number) => formatRate(v, v >= 0.995 && v < 1 ? 1 : 0);
const money = (v: number) => formatNumber(Math.abs(v), 0);
const times = (v: number) => formatNumber(v, v >= 10 ? 0 : 1);

/**
 * Picks, at one sample size, the estimator with the lowest RMSE among those whose coverage is at
 * least the confidence less two Monte Carlo standard errors, 2·sqrt(c(1 − c)/trials) — the
 * tolerance that keeps an estimator with exactly nominal coverage from failing by chance.
 *
 * @param o.atSize the plan's sample size; when it was not simulated, the largest simulated size.
 * @param o.misstatedShare the scenario's share of misstated items, to say when too few differences
 *   are expected for the difference, ratio and regression estimators.
 */
export function recommendEstimator(o: {
  cells: AdvisorCell[];
  confidence: number;
  trials: number;
  atSize?: number;
  misstatedShare?: number;
}): Recommendation {
  const sizes = [...new Set(o.cells.map((c) => c.sampleSize))].sort((a, b) => a - b);
  if (sizes.length === 0) throw new EngineInputError("cells", "cells must hold at least one result");
  const sampleSize = o.atSize !== undefined && sizes.includes(o.atSize) ? o.atSize : sizes[sizes.length - 1]!;
  const cells = o.cells.filter((c) => c.sampleSize === sampleSize);
  const coverageFloor = o.confidence - 2 * Math.sqrt((o.confidence * (1 - o.confidence)) / o.trials);
  const eligible = cells.filter((c) => !isComparisonEstimator(c.estimator) && c.performance.coverage >= coverageFloor);
  const best = eligible.reduce<AdvisorCell | null>(
    (b, c) => (b === null || c.performance.rmse < b.performance.rmse ? c : b),
    null,
  );
  const expectedDifferences = o.misstatedShare === undefined ? null : o.misstatedShare * sampleSize;

  const verdicts: Verdict[] = cells.map((c) => {
    const p = c.performance;
    const label = ADVISED_ESTIMATOR_LABELS[c.estimator];
    if (isComparisonEstimator(c.estimator)) return comparisonVerdict(c, cells);
    if (c === best) {
      return {
        estimator: c.estimator,
        verdict: "recommended",
        reason: `${label}: the lowest RMSE (${money(p.rmse)}) among the estimators whose bound held the truth in at least ${pct(coverageFloor)} of trials (${pct(p.coverage)}).`,
      };
    }
    if (p.coverage < coverageFloor) {
      const few =
        DIFFERENCE_TYPE.includes(c.estimator) && expectedDifferences !== null && expectedDifferences < FEW_DIFFERENCES
          ? ` — too few misstatements expected (about ${formatNumber(expectedDifferences, expectedDifferences < 1 ? 1 : 0)} in the sample)`
          : "";
      return {
        estimator: c.estimator,
        verdict: "short-coverage",
        reason: `${label}: coverage ${pct(p.coverage)} at n = ${sampleSize}, below the ${pct(o.confidence)} confidence${few}.`,
      };
    }
    const b = best!.performance;
    const biasShare = p.rmse > 0 ? Math.abs(p.bias) / p.rmse : 0;
    const reason =
      biasShare > 0.5
        ? `${label}: biased by ${money(p.bias)} (${pct(biasShare)} of its RMSE); RMSE ${times(p.rmse / b.rmse)} times the ${ADVISED_ESTIMATOR_LABELS[best!.estimator].toLowerCase()}'s.`
        : `${label}: ${biasShare < 0.1 ? "unbiased" : "slightly biased"} but its spread is ${times(p.standardDeviation / Math.max(b.standardDeviation, Number.MIN_VALUE))} times wider (RMSE ${money(p.rmse)} against ${money(b.rmse)}).`;
    return { estimator: c.estimator, verdict: "wider", reason };
  });
  verdicts.sort((a, b) => (a.verdict === "recommended" ? -1 : b.verdict === "recommended" ? 1 : 0));

  const summary =
    best === null
      ? `No estimator's bound held the truth in at least ${pct(coverageFloor)} of trials at n = ${sampleSize}: consider a larger sample or another method.`
      : `At n = ${sampleSize}, ${ADVISED_ESTIMATOR_LABELS[best.estimator].toLowerCase()} gives the most accurate estimate under the assumed misstatements while its bound still holds at the stated confidence.`;
  return {
    sampleSize,
    recommended: best?.estimator ?? null,
    coverageFloor,
    verdicts,
    summary,
    tradeOff: tradeOffLine(cells),
  };
}

function comparisonVerdict(c: AdvisorCell, cells: AdvisorCell[]): Verdict {
  const p = c.performance;
  const ratio = cells.find((r) => r.estimator === "ratio")?.performance;
  const label = ADVISED_ESTIMATOR_LABELS[c.estimator];
  const against = ratio ? `; the plain ratio estimator: bias ${money(ratio.bias)}, RMSE ${money(ratio.rmse)}` : "";
  const undefinedNote = p.undefinedTrials ? `; undefined in ${p.undefinedTrials} trials` : "";
  return {
    estimator: c.estimator,
    verdict: "comparison",
    reason: `${label} (for comparison): bias ${money(p.bias)}, RMSE ${money(p.rmse)}, coverage ${pct(p.coverage)}${against}${undefinedNote}.`,
  };
}

/**
 * "Less biased but worse": a corrected ratio estimator with a smaller |bias| than the plain ratio
 * estimator and a larger RMSE — its extra variance costs more than the bias it removes.
 */
function tradeOffLine(cells: AdvisorCell[]): string | null {
  const ratio = cells.find((c) => c.estimator === "ratio")?.performance;
  if (!ratio || !Number.isFinite(ratio.rmse)) return null;
  const worse = cells.filter(
    (c) =>
      isComparisonEstimator(c.estimator) &&
      Math.abs(c.performance.bias) < Math.abs(ratio.bias) &&
      c.performance.rmse > ratio.rmse,
  );
  if (worse.length === 0) return null;
  const names = worse.map((c) => ADVISED_ESTIMATOR_LABELS[c.estimator].replace(/ \(.*\)$/, "")).join(", ");
  return `${names} ${worse.length === 1 ? "removes" : "remove"} most of the ratio estimator's bias (${money(ratio.bias)}) but ${worse.length === 1 ? "its" : "their"} extra spread costs more than the bias removed: RMSE ${worse.map((c) => money(c.performance.rmse)).join(", ")} against ${money(ratio.rmse)}. On this population the plain ratio estimator is the better choice of the ratio forms.`;
}
