/**
 * Estimator advisor: repeated simple random samples from a population whose audited values are
 * known or assumed, to compare the estimators' error at the needed reliability.
 */
import type { PairedMoments } from "./descriptive";
import { toCents } from "./money";
import { createRng, type Rng } from "./rng";
import { ESTIMATORS, SIDES, type Estimator, type SampledItem, type Sides } from "./types";
import { zFor } from "./evaluate-variables";
import { estimateTotal } from "./variables-core";
import {
  CORRECTED_RATIO_ESTIMATORS,
  correctedRatioTotal,
  ratioItemStats,
  type CorrectedRatioEstimator,
} from "./ratio-corrected";
import {
  requireArray,
  requireInteger,
  requireObject,
  requireOneOf,
  requireOpenFraction,
  requireSeed,
} from "./validate";
import { EngineInputError } from "./errors";

/** Everything `simulateEstimators` compares: the four evaluation estimators and the bias-corrected ratio forms. */
export type SimulatedEstimator = Estimator | CorrectedRatioEstimator;
export const SIMULATED_ESTIMATORS: readonly SimulatedEstimator[] = [...ESTIMATORS, ...CORRECTED_RATIO_ESTIMATORS];

export interface HistogramBin {
  from: number;
  to: number;
  count: number;
}
export interface EstimatorPerformance {
  meanEstimate: number;
  /** meanEstimate − true audited total. */
  bias: number;
  /** Standard deviation of the estimates over trials (divisor = trials). */
  standardDeviation: number;
  /** sqrt(bias² + standardDeviation²). */
  rmse: number;
  /** Share of trials whose bound (two-sided, or the one side asked for) holds the true audited total. */
  coverage: number;
  meanAllowance: number;
  histogram: HistogramBin[];
  /** Trials where the estimator was undefined (a ratio form with a sample book total of zero); counted as not covered. */
  undefinedTrials?: number;
}

export const HISTOGRAM_BINS = 20;
/** How often (in trials) `onProgress` is told how far a run has gone. */
export const PROGRESS_EVERY = 500;

/**
 * Draws n distinct indices by partial Fisher–Yates on a persistent permutation (Knuth, TAOCP
 * vol. 2, Algorithm P, stopped after n steps): step j swaps position j with j + floor(u·(N − j)).
 * Any starting permutation gives a uniform random n-subset, so the array is not reset between draws.
 */
export function drawSimpleRandomSample(rng: Rng, permutation: Int32Array, sampleSize: number): void {
  const N = permutation.length;
  for (let j = 0; j < sampleSize; j++) {
    const r = j + Math.floor(rng.nextDouble() * (N - j));
    const t = permutation[j]!;
    permutation[j] = permutation[r]!;
    permutation[r] = t;
  }
}

function histogram(values: Float64Array): HistogramBin[] {
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (!(max >= min)) return [];
  const bins = max > min ? HISTOGRAM_BINS : 1;
  const width = (max - min) / bins;
  const counts = new Array<number>(bins).fill(0);
  for (const v of values) counts[bins === 1 ? 0 : Math.min(bins - 1, Math.floor((v - min) / width))]!++;
  return counts.map((count, b) => ({
    from: (min + b * width) / 100,
    to: (b === bins - 1 ? max : min + (b + 1) * width) / 100,
    count,
  }));
}

/** Bias, spread, RMSE, coverage, mean allowance and histogram of one estimator's trial estimates (all in cents). */
export function summariseTrials(
  all: Float64Array,
  truthCents: number,
  coveredTrials: number,
  allowanceSumCents: number,
): EstimatorPerformance {
  const trials = all.length;
  let estimates = all;
  for (const v of all)
    if (!Number.isFinite(v)) {
      estimates = all.filter(Number.isFinite);
      break;
    }
  const defined = estimates.length;
  let sum = 0;
  for (const v of estimates) sum += v;
  const meanEstimate = defined > 0 ? sum / defined : NaN;
  let squares = 0;
  for (const v of estimates) squares += (v - meanEstimate) * (v - meanEstimate);
  const bias = (meanEstimate - truthCents) / 100;
  const standardDeviation = Math.sqrt(squares / defined) / 100;
  return {
    meanEstimate: meanEstimate / 100,
    bias,
    standardDeviation,
    rmse: Math.sqrt(bias * bias + standardDeviation * standardDeviation),
    coverage: coveredTrials / trials,
    meanAllowance: defined > 0 ? allowanceSumCents / defined / 100 : NaN,
    histogram: histogram(estimates),
    ...(defined < trials ? { undefinedTrials: trials - defined } : {}),
  };
}

function parsePopulation(value: unknown, needNonZeroBook: boolean): { x: Float64Array; y: Float64Array } {
  const population = requireArray<SampledItem>("population", value);
  if (population.length < 2)
    throw new EngineInputError("population", `population must hold at least 2 items (got ${population.length})`);
  const x = new Float64Array(population.length);
  const y = new Float64Array(population.length);
  for (let i = 0; i < population.length; i++) {
    const item = requireObject(`population[${i}]`, population[i]);
    x[i] = toCents(`population[${i}].bookValue`, item.bookValue);
    y[i] = toCents(`population[${i}].auditedValue`, item.auditedValue);
    if (needNonZeroBook && x[i] === 0)
      throw new EngineInputError(
        `population[${i}].bookValue`,
        `population[${i}].bookValue is zero: the Hartley–Ross estimator needs every y/x defined`,
      );
  }
  return { x, y };
}

/**
 * Monte Carlo comparison of variables estimators under simple random sampling without replacement.
 *
 * One `createRng(seed)` stream for the whole run; each trial draws a sample with
 * `drawSimpleRandomSample` and evaluates every requested estimator with the same formulas as
 * `evaluateVariables` (Cochran 1977; normal bound at `confidence`, two-sided unless `sides` says
 * "lower" — the bound for overstatement — or "upper"), and the bias-corrected ratio forms
 * (Hartley–Ross, jackknife, Beale, Tin; `correctedRatioTotal`) as comparison rows. Ratio forms are
 * defined whenever the sample's book total is not zero, so zero and negative book values are allowed;
 * a trial where one is undefined is left out of its bias and spread and counts as not covered
 * (`undefinedTrials`). Sample moments are
 * accumulated in one pass on values shifted by the known population means, which keeps them well
 * conditioned; nothing is allocated per trial beyond the estimator results.
 *
 * @throws {TypeError} when a field has the wrong type.
 * @throws {RangeError} naming the field: population of fewer than 2 items, sampleSize outside
 *   2..N (3..N with regression), trials outside 1..1,000,000, unknown or repeated estimator,
 *   a zero book value with the Hartley–Ross estimator.
 * @example
 * simulateEstimators({ population, sampleSize: 200, trials: 10000, seed: 1, confidence: 0.95,
 *   estimators: ["mean-per-unit", "ratio"] })
 * // → { "mean-per-unit": { bias: …, rmse: …, coverage: 0.95…, … }, ratio: { … } }
 */
export function simulateEstimators<E extends SimulatedEstimator>(o: {
  population: SampledItem[];
  sampleSize: number;
  trials: number;
  seed: number;
  confidence: number;
  estimators: E[];
  sides?: Sides;
  onProgress?: (trialsDone: number) => void;
}): Record<E, EstimatorPerformance> {
  requireObject("options", o);
  const estimators = requireArray<E>("estimators", o.estimators);
  if (estimators.length === 0) throw new EngineInputError("estimators", "estimators must name at least one estimator");
  estimators.forEach((e, i) => {
    requireOneOf(`estimators[${i}]`, e, SIMULATED_ESTIMATORS);
    if (estimators.indexOf(e) !== i) throw new EngineInputError(`estimators[${i}]`, `estimators[${i}] repeats "${e}"`);
  });
  const { x, y } = parsePopulation(o.population, estimators.includes("hartley-ross" as E));
  const corrected = estimators.map((e) => (CORRECTED_RATIO_ESTIMATORS as readonly string[]).includes(e));
  const anyCorrected = corrected.includes(true);
  const N = x.length;
  const sampleSize = requireInteger("sampleSize", o.sampleSize, estimators.includes("regression" as E) ? 3 : 2, N);
  const trials = requireInteger("trials", o.trials, 1, 1_000_000);
  const rng = createRng(requireSeed("seed", o.seed));
  const sides = o.sides === undefined ? "two" : requireOneOf("sides", o.sides, SIDES);
  const z = zFor(requireOpenFraction("confidence", o.confidence), sides);

  let bookCents = 0;
  let truthCents = 0;
  for (let i = 0; i < N; i++) {
    bookCents += x[i]!;
    truthCents += y[i]!;
  }
  if (!Number.isSafeInteger(bookCents) || !Number.isSafeInteger(truthCents))
    throw new EngineInputError("population", "population totals exceed the exact range in cents");
  const xBar = bookCents / N;
  const dBar = (truthCents - bookCents) / N;
  // One record of four doubles per item (x − x̄, d − d̄, x, y): a random draw touches one cache line per item.
  const packed = new Float64Array(4 * N);
  for (let i = 0; i < N; i++) {
    const xi = x[i]!,
      yi = y[i]!;
    packed[4 * i] = xi - xBar;
    packed[4 * i + 1] = yi - xi - dBar;
    packed[4 * i + 2] = xi;
    packed[4 * i + 3] = yi;
  }
  const sampleX = new Float64Array(sampleSize);
  const sampleY = new Float64Array(sampleX.length);
  const positions = Int32Array.from({ length: sampleX.length }, (_, j) => j);

  const permutation = Int32Array.from({ length: N }, (_, i) => i);
  const estimates = estimators.map(() => new Float64Array(trials));
  const covered = new Float64Array(estimators.length);
  const allowanceSum = new Float64Array(estimators.length);
  const n = sampleSize;
  const m: PairedMoments = {
    n,
    sumX: 0,
    sumY: 0,
    meanX: 0,
    meanY: 0,
    meanD: 0,
    varX: 0,
    varY: 0,
    varD: 0,
    covXY: 0,
    covXD: 0,
    nonZeroDifferences: 0,
  };
  for (let t = 0; t < trials; t++) {
    drawSimpleRandomSample(rng, permutation, n);
    let sx = 0,
      sd = 0,
      sxx = 0,
      sdd = 0,
      sxd = 0,
      rawX = 0,
      rawY = 0;
    for (let j = 0; j < n; j++) {
      const k = 4 * permutation[j]!;
      const a = packed[k]!,
        b = packed[k + 1]!,
        bx = packed[k + 2]!,
        by = packed[k + 3]!;
      sx += a;
      sd += b;
      sxx += a * a;
      sdd += b * b;
      sxd += a * b;
      rawX += bx;
      rawY += by;
      sampleX[j] = bx;
      sampleY[j] = by;
    }
    m.meanX = xBar + sx / n;
    m.meanD = dBar + sd / n;
    m.meanY = m.meanX + m.meanD;
    m.sumX = rawX; // exact in cents: a sample book total of zero leaves the ratio forms undefined
    m.sumY = rawY;
    m.varX = Math.max(0, (sxx - (sx * sx) / n) / (n - 1));
    m.varD = Math.max(0, (sdd - (sd * sd) / n) / (n - 1));
    m.covXD = (sxd - (sx * sd) / n) / (n - 1);
    m.covXY = m.varX + m.covXD;
    m.varY = Math.max(0, m.varX + m.varD + 2 * m.covXD);
    const stats = anyCorrected ? ratioItemStats(sampleX, sampleY, positions, n, m.sumX, m.sumY) : null;
    for (let e = 0; e < estimators.length; e++) {
      const r = corrected[e]
        ? correctedRatioTotal(estimators[e] as CorrectedRatioEstimator, m, stats!, N, bookCents)
        : estimateTotal(estimators[e] as Estimator, m, N, bookCents);
      const allowance = z * Math.sqrt(r.variance);
      if (!Number.isFinite(r.estimate) || !Number.isFinite(allowance)) {
        estimates[e]![t] = NaN;
        continue;
      }
      estimates[e]![t] = r.estimate;
      allowanceSum[e]! += allowance;
      const error = r.estimate - truthCents;
      if (
        (sides !== "lower" || error <= allowance) &&
        (sides !== "upper" || -error <= allowance) &&
        (sides !== "two" || Math.abs(error) <= allowance)
      )
        covered[e]!++;
    }
    if (o.onProgress && (t + 1) % PROGRESS_EVERY === 0) o.onProgress(t + 1);
  }
  const result = {} as Record<E, EstimatorPerformance>;
  estimators.forEach((name, e) => {
    result[name] = summariseTrials(estimates[e]!, truthCents, covered[e]!, allowanceSum[e]!);
  });
  return result;
}
