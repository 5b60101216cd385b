/**
 * Monetary-unit sampling evaluation: the Stringer bound, overstatement and understatement apart.
 */
import { formatFactor } from "../format/number";
import { EngineInputError } from "./errors";
import { toCents } from "./money";
import { poissonFactors } from "./poisson-factor";
import { sampleToCents } from "./sample-input";
import { FACTOR_MODES, type FactorMode, type SampledItem } from "./types";
import { requireObject, requireOneOf, requireOpenFraction, requirePositive } from "./validate";

export interface BoundSide {
  /** RF(0) · J. */
  basicPrecision: number;
  /** Σ t_k · J plus the top stratum's actual misstatement in this direction. */
  projected: number;
  /** Σ (RF(k) − RF(k−1) − 1) · t_k · J. */
  incrementalAllowance: number;
  /** basicPrecision + projected + incrementalAllowance. */
  upperLimit: number;
  /** Taintings in this direction (as positive fractions), largest first. */
  taintings: number[];
  /** The top stratum's part of `projected`, at actual amount. */
  topStratumMisstatement: number;
}

export interface MusEvaluation {
  overstatement: BoundSide;
  understatement: BoundSide;
  mostLikelyMisstatement: number;
  netUpperLimits: { overstatement: number; understatement: number };
  /** Which factors produced the bound: "exact" gamma quantiles or "table" (rounded up to 2 dp). */
  factorMode: FactorMode;
  warnings: string[];
}

/**
 * The lowest confidence a Stringer bound is evaluated at. Below 1 − 1/e ≈ 63.2 % the basic precision
 * factor RF(0) = −ln(1 − c) falls below 1, and below about 53 % the increments RF(k) − RF(k−1) fall
 * below 1, which makes the incremental allowance negative (gamma quantiles, checked with scipy).
 */
export const MUS_MIN_CONFIDENCE = 0.63;
export const MUS_CONFIDENCE_MESSAGE = `confidence must be at least ${MUS_MIN_CONFIDENCE * 100}% for a monetary-unit sample: below it the reliability factor RF(0) drops under 1 and, lower still, the increments RF(k) − RF(k−1) drop under 1, so the Stringer bound's incremental allowance would turn negative`;

function side(taintings: number[], topCents: number, interval: number, factors: number[]): BoundSide {
  const sorted = [...taintings].sort((a, b) => b - a);
  let sumT = 0;
  let incremental = 0;
  sorted.forEach((t, i) => {
    sumT += t;
    incremental += (factors[i + 1]! - factors[i]! - 1) * t;
  });
  const basicPrecision = factors[0]! * interval;
  const projected = sumT * interval + topCents / 100;
  const incrementalAllowance = incremental * interval;
  return {
    basicPrecision,
    projected,
    incrementalAllowance,
    upperLimit: basicPrecision + projected + incrementalAllowance,
    taintings: sorted,
    topStratumMisstatement: topCents / 100,
  };
}

/**
 * Stringer bound for a monetary-unit sample (Stringer 1963 as presented in the AICPA Audit Guide
 * "Audit Sampling" and Leslie, Teitlebaum & Anderson 1979 — from memory for the presentation).
 *
 * For each PPS-hit item below the interval, tainting t = (book − audited)/book (overstatement) or
 * (audited − book)/book (understatement), ranked from largest. Each direction on its own:
 * basicPrecision = RF(0)·J; projected = Σ t_k·J + top-stratum misstatement in that direction (at its
 * actual amount, no allowance); incrementalAllowance = Σ (RF(k) − RF(k−1) − 1)·t_k·J; upperLimit is
 * their sum. mostLikelyMisstatement = projected over − projected under; netUpperLimits subtract the
 * opposite direction's projected misstatement. Taintings above 1 are kept, with a warning.
 * RF from `poissonFactor` in the chosen mode (default "exact"). Results are not rounded.
 *
 * @param o.sample distinct PPS-hit items with book value below the interval (book > 0).
 * @param o.topStratum items at or above the interval, examined 100%.
 * @throws {TypeError} when a field has the wrong type.
 * @throws {RangeError} naming the field: interval <= 0, confidence outside [0.63, 1) (see
 *   MUS_MIN_CONFIDENCE), a sample book
 *   value <= 0, a value with more than 2 decimals, unknown factors mode.
 * @example
 * evaluateMus({ interval: 21920, confidence: 0.95, sample: [{ bookValue: 5480, auditedValue: 4384 }], factors: "table" })
 * // → overstatement { basicPrecision: 65760, projected: 4384, incrementalAllowance: 3288, upperLimit: 73432, … }
 */
export function evaluateMus(o: {
  interval: number;
  confidence: number;
  sample: SampledItem[];
  topStratum?: SampledItem[];
  factors?: FactorMode;
}): MusEvaluation {
  requireObject("options", o);
  const interval = requirePositive("interval", o.interval);
  toCents("interval", interval);
  const confidence = requireOpenFraction("confidence", o.confidence);
  if (confidence < MUS_MIN_CONFIDENCE)
    throw new EngineInputError("confidence", `${MUS_CONFIDENCE_MESSAGE} (got ${confidence})`);
  const factorMode = o.factors === undefined ? "exact" : requireOneOf("factors", o.factors, FACTOR_MODES);
  const sample = sampleToCents("sample", o.sample, 0);
  const top = sampleToCents("topStratum", o.topStratum ?? [], 0);
  const warnings: string[] = [];

  const over: number[] = [];
  const under: number[] = [];
  for (let i = 0; i < sample.book.length; i++) {
    const book = sample.book[i]!;
    if (book <= 0)
      throw new EngineInputError(
        `sample[${i}].bookValue`,
        `sample[${i}].bookValue must be greater than zero: PPS hits have positive book values`,
      );
    if (book >= interval * 100)
      warnings.push(`sample[${i}] has a book value at or above the interval: it belongs in the top stratum.`);
    const t = (book - sample.audited[i]!) / book;
    if (t > 0) over.push(t);
    if (t < 0) under.push(-t);
    if (Math.abs(t) > 1)
      warnings.push(
        `sample[${i}] has a tainting of ${formatFactor(Math.abs(t))} (above 1): kept uncapped, but the Stringer bound assumes taintings between 0 and 1.`,
      );
  }
  let topOver = 0;
  let topUnder = 0;
  for (let i = 0; i < top.book.length; i++) {
    const d = top.book[i]! - top.audited[i]!;
    if (d > 0) topOver += d;
    else topUnder -= d;
  }
  const factors = poissonFactors(Math.max(over.length, under.length) + 1, confidence, factorMode);
  const overstatement = side(over, topOver, interval, factors);
  const understatement = side(under, topUnder, interval, factors);
  return {
    overstatement,
    understatement,
    mostLikelyMisstatement: overstatement.projected - understatement.projected,
    netUpperLimits: {
      overstatement: overstatement.upperLimit - understatement.projected,
      understatement: understatement.upperLimit - overstatement.projected,
    },
    factorMode,
    warnings,
  };
}
