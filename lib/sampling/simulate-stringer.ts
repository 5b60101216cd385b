/**
 * Estimator advisor, monetary-unit side: repeated systematic PPS samples from a population whose
 * audited values are known or assumed, each evaluated with the Stringer bound.
 */
import { poissonFactors } from "./poisson-factor";
import { createRng } from "./rng";
import { PROGRESS_EVERY, summariseTrials, type EstimatorPerformance } from "./simulate";
import { SIDES, type FactorMode, FACTOR_MODES, type SampledItem, type Sides } from "./types";
import { toCentsFast } from "./money";
import {
  requireArray,
  requireInteger,
  requireObject,
  requireOneOf,
  requireOpenFraction,
  requireSeed,
} from "./validate";
import { EngineInputError } from "./errors";

export interface StringerPerformance extends EstimatorPerformance {
  /** The sampling interval used, in currency units: positive book total / sampleSize, to the cent. */
  interval: number;
  /** Items at or above the interval: always hit, counted at their actual misstatement. */
  topStratumItems: number;
}

/** Index of the first cumulative total at or above `point` (cumulative is ascending). */
function findHit(cumulative: Float64Array, point: number, from: number): number {
  let lo = from;
  let hi = cumulative.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (cumulative[mid]! < point) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Σ t_k·(RF(k) − RF(k−1)) for taintings sorted largest first: projected + incremental allowance, per unit of interval. */
function rankedSum(taintings: Float64Array, count: number, factors: number[]): number {
  let s = 0;
  for (let k = 0; k < count; k++) s += taintings[k]! * (factors[k + 1]! - factors[k]!);
  return s;
}

function sortDescending(values: Float64Array, count: number): void {
  values.subarray(0, count).sort();
  values.subarray(0, count).reverse();
}

/**
 * Monte Carlo performance of the Stringer bound under systematic monetary-unit selection, in the
 * same terms as `simulateEstimators` so the two can be compared: the "estimate" is the estimated
 * audited total, book total − most likely misstatement (misstatement of items outside the PPS frame,
 * book value ≤ 0, is taken at its actual amount as if tested apart).
 *
 * Interval J = floor(positive book total in cents / sampleSize). Each trial: random start
 * r = 1 + floor(u·J) from one `createRng(seed)` stream (so trial 1 selects what `selectPps` selects
 * for the same seed and interval); points r + kJ hit the item whose cumulative total first reaches
 * them. Items with book ≥ J form the top stratum (actual misstatement, no allowance); other hit items
 * give taintings t = (book − audited)/book. Over- and understatement bounds as in `evaluateMus`
 * (Stringer 1963; AICPA Audit Guide "Audit Sampling"); net limits subtract the opposite projection.
 * Coverage: "lower" (an overstatement test) — the net overstatement limit holds the true net
 * overstatement; "upper" — the net understatement limit holds the true net understatement; "two" —
 * both hold. meanAllowance: mean of (limit − most likely misstatement) on the tested side (the wider
 * of the two for "two").
 *
 * @throws {TypeError} when a field has the wrong type.
 * @throws {RangeError} naming the field: fewer than 2 items, no positive book value, sampleSize
 *   outside 1..positive items, trials outside 1..1,000,000, unknown sides or factors mode.
 */
export function simulateStringer(o: {
  population: SampledItem[];
  sampleSize: number;
  trials: number;
  seed: number;
  confidence: number;
  sides?: Sides;
  factors?: FactorMode;
  onProgress?: (trialsDone: number) => void;
}): StringerPerformance {
  requireObject("options", o);
  const population = requireArray<SampledItem>("population", o.population);
  if (population.length < 2)
    throw new EngineInputError("population", `population must hold at least 2 items (got ${population.length})`);
  const confidence = requireOpenFraction("confidence", o.confidence);
  const sides = o.sides === undefined ? "lower" : requireOneOf("sides", o.sides, SIDES);
  const factorMode = o.factors === undefined ? "exact" : requireOneOf("factors", o.factors, FACTOR_MODES);
  const trials = requireInteger("trials", o.trials, 1, 1_000_000);
  const rng = createRng(requireSeed("seed", o.seed));

  const frameIndex: number[] = [];
  let bookCents = 0;
  let truthCents = 0;
  let frameCents = 0;
  let frameMisstatement = 0;
  const x = new Float64Array(population.length);
  const y = new Float64Array(population.length);
  for (let i = 0; i < population.length; i++) {
    const item = requireObject(`population[${i}]`, population[i]);
    x[i] = toCentsFast(item.bookValue, (j) => `population[${j}].bookValue`, i);
    y[i] = toCentsFast(item.auditedValue, (j) => `population[${j}].auditedValue`, i);
    bookCents += x[i]!;
    truthCents += y[i]!;
    if (x[i]! > 0) {
      frameIndex.push(i);
      frameCents += x[i]!;
      frameMisstatement += x[i]! - y[i]!;
    }
  }
  if (!Number.isSafeInteger(bookCents) || !Number.isSafeInteger(truthCents) || !Number.isSafeInteger(frameCents))
    throw new EngineInputError("population", "population totals exceed the exact range in cents");
  if (frameIndex.length === 0)
    throw new EngineInputError(
      "population",
      "population must hold at least one item with a positive book value for monetary-unit sampling",
    );
  const sampleSize = requireInteger("sampleSize", o.sampleSize, 1, frameIndex.length);
  const J = Math.floor(frameCents / sampleSize);
  if (J < 1) throw new EngineInputError("sampleSize", `sampleSize (${sampleSize}) gives an interval below one cent`);
  const outsideFrameMisstatement = bookCents - truthCents - frameMisstatement;

  const cumulative = new Float64Array(frameIndex.length);
  const taint = new Float64Array(frameIndex.length);
  const top = new Uint8Array(frameIndex.length);
  let running = 0;
  let topOver = 0;
  let topUnder = 0;
  let topStratumItems = 0;
  frameIndex.forEach((i, f) => {
    running += x[i]!;
    cumulative[f] = running;
    taint[f] = (x[i]! - y[i]!) / x[i]!;
    if (x[i]! >= J) {
      top[f] = 1;
      topStratumItems++;
      const d = x[i]! - y[i]!;
      if (d > 0) topOver += d;
      else topUnder -= d;
    }
  });

  // Items below the interval are hit at most once, so no trial gives more taintings than this.
  const capacity = Math.min(frameIndex.length, Math.floor((frameCents - 1) / J) + 1);
  const factors = poissonFactors(capacity + 1, confidence, factorMode);
  const over = new Float64Array(capacity);
  const under = new Float64Array(capacity);
  const estimates = new Float64Array(trials);
  let covered = 0;
  let allowanceSum = 0;
  for (let t = 0; t < trials; t++) {
    let point = 1 + Math.floor(rng.nextDouble() * J);
    let nOver = 0,
      nUnder = 0,
      sumOver = 0,
      sumUnder = 0;
    let from = 0;
    while (point <= frameCents) {
      const f = findHit(cumulative, point, from);
      if (!top[f]) {
        const tk = taint[f]!;
        if (tk > 0) {
          over[nOver++] = tk;
          sumOver += tk;
        } else if (tk < 0) {
          under[nUnder++] = -tk;
          sumUnder -= tk;
        }
      }
      from = f;
      point += J;
    }
    sortDescending(over, nOver);
    sortDescending(under, nUnder);
    const projectedOver = sumOver * J + topOver;
    const projectedUnder = sumUnder * J + topUnder;
    const mostLikely = projectedOver - projectedUnder;
    const netOverLimit = factors[0]! * J + rankedSum(over, nOver, factors) * J + topOver - projectedUnder;
    const netUnderLimit = factors[0]! * J + rankedSum(under, nUnder, factors) * J + topUnder - projectedOver;
    estimates[t] = bookCents - mostLikely - outsideFrameMisstatement;
    const overHolds = frameMisstatement <= netOverLimit;
    const underHolds = -frameMisstatement <= netUnderLimit;
    if (
      (sides === "lower" && overHolds) ||
      (sides === "upper" && underHolds) ||
      (sides === "two" && overHolds && underHolds)
    )
      covered++;
    const overAllowance = netOverLimit - mostLikely;
    const underAllowance = netUnderLimit + mostLikely;
    allowanceSum +=
      sides === "lower" ? overAllowance : sides === "upper" ? underAllowance : Math.max(overAllowance, underAllowance);
    if (o.onProgress && (t + 1) % PROGRESS_EVERY === 0) o.onProgress(t + 1);
  }

  return {
    ...summariseTrials(estimates, truthCents, covered, allowanceSum),
    interval: J / 100,
    topStratumItems,
  };
}
