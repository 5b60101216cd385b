/**
 * Monetary-unit (PPS) selection: systematic selection of cents with a random start.
 * Leslie, Teitlebaum & Anderson, Dollar-Unit Sampling (1979) and the AICPA Audit Guide
 * "Audit Sampling" describe the method (from memory); the exact variant is Sondage's contract.
 */
import { toCents, toCentsFast } from "./money";
import { createRng } from "./rng";
import { requireArray, requireObject, requirePositive, requireSeed } from "./validate";
import { EngineInputError } from "./errors";

export interface PpsHit {
  /** 0-based index in the population. */
  index: number;
  /** Selection points that fell in this item, in currency units (cumulative position in the frame). */
  hitPoints: number[];
}

export interface PpsSelection {
  /** Hit items, each once, in population order. */
  hits: PpsHit[];
  /** Items with book value <= 0: never selected by PPS, to be tested separately. */
  excluded: number[];
  /** Sum of the positive book values, in currency units. */
  frameTotal: number;
  /** The interval used, in whole cents, expressed in currency units. */
  intervalUsed: number;
  /** The random start r, in currency units (r cents / 100). */
  randomStart: number;
}

const bookValueField = (i: number) => `bookValues[${i}]`;

/** Guard against an interval so small that the selection would exhaust memory. */
export const MAX_SELECTION_POINTS = 1_000_000;

/**
 * Systematic monetary-unit selection with a random start, in integer cents, in one pass.
 *
 * Frame: items with book value > 0 in population order, cumulative totals c_i in cents.
 * J = interval in cents (rounded to a cent); r = 1 + floor(u_0 · J) with u_0 the first
 * `nextDouble()` of `createRng(seed)`; points p_j = r + j·J while p_j <= c_last; item i is hit by p
 * when c_(i-1) < p <= c_i. An item with book value >= interval is always hit (the caller's top
 * stratum); one below it is hit at most once. If the frame total is below r, nothing is hit.
 *
 * @param o.bookValues book values in currency units, at most 2 decimals.
 * @param o.interval sampling interval in currency units, at least 0.01.
 * @throws {TypeError} when bookValues is not an array or a value is not a number.
 * @throws {RangeError} naming `bookValues[i]` or `interval` when a value is invalid, when the
 *   frame total exceeds the exact range in cents, or when it would give more than 1,000,000 points.
 * @example
 * selectPps({ bookValues: [100, 0, 250.5, -20, 80], interval: 100, seed: 5489 })
 * // → { hits: [{ index: 0, hitPoints: [81.48] }, { index: 2, hitPoints: [181.48, 281.48] },
 * //      { index: 4, hitPoints: [381.48] }], excluded: [1, 3], frameTotal: 430.5,
 * //    intervalUsed: 100, randomStart: 81.48 }
 */
export function selectPps(o: { bookValues: number[]; interval: number; seed: number }): PpsSelection {
  requireObject("options", o);
  const bookValues = requireArray<number>("bookValues", o.bookValues);
  const intervalCents = toCents("interval", requirePositive("interval", o.interval));
  if (intervalCents < 1) throw new EngineInputError("interval", `interval must be at least 0.01 (got ${o.interval})`);
  const rng = createRng(requireSeed("seed", o.seed));
  const startCents = 1 + Math.floor(rng.nextDouble() * intervalCents);

  const hits: PpsHit[] = [];
  const excluded: number[] = [];
  let cumulative = 0;
  let point = startCents;
  let pointCount = 0;
  for (let i = 0; i < bookValues.length; i++) {
    const cents = toCentsFast(bookValues[i], bookValueField, i);
    if (cents <= 0) {
      excluded.push(i);
      continue;
    }
    cumulative += cents;
    if (!Number.isSafeInteger(cumulative))
      throw new EngineInputError("bookValues", "bookValues total exceeds the exact range in cents");
    if (point > cumulative) continue;
    const hitPoints: number[] = [];
    while (point <= cumulative) {
      hitPoints.push(point / 100);
      point += intervalCents;
      if (++pointCount > MAX_SELECTION_POINTS) {
        throw new EngineInputError(
          "interval",
          `interval (${o.interval}) is too small for this population: more than ${MAX_SELECTION_POINTS} selection points`,
        );
      }
    }
    hits.push({ index: i, hitPoints });
  }
  return {
    hits,
    excluded,
    frameTotal: cumulative / 100,
    intervalUsed: intervalCents / 100,
    randomStart: startCents / 100,
  };
}
