/**
 * Simple random selection without replacement by random-number sort (the "random number
 * assigned to every item, take the n smallest" procedure; common practice, and the textbook
 * definition of SRSWOR by ordering on i.i.d. uniforms — Cochran 1977 §2.2 lists it as a valid draw).
 */
import { createRng } from "./rng";
import { requireInteger, requireObject, requireSeed } from "./validate";

/** Upper bound on populationSize: indices are held in an Int32Array. */
export const MAX_POPULATION_SIZE = 2 ** 31 - 1;

// Max-heap on (u, index): the root is the largest of the n smallest seen so far.
function isAbove(u: Float64Array, idx: Int32Array, a: number, b: number): boolean {
  return u[a]! > u[b]! || (u[a] === u[b] && idx[a]! > idx[b]!);
}

function siftDown(u: Float64Array, idx: Int32Array, size: number, start: number): void {
  let parent = start;
  for (;;) {
    const left = 2 * parent + 1;
    if (left >= size) return;
    let largest = left;
    const right = left + 1;
    if (right < size && isAbove(u, idx, right, left)) largest = right;
    if (!isAbove(u, idx, largest, parent)) return;
    const tu = u[parent]!;
    u[parent] = u[largest]!;
    u[largest] = tu;
    const ti = idx[parent]!;
    idx[parent] = idx[largest]!;
    idx[largest] = ti;
    parent = largest;
  }
}

/**
 * Random-number-sort selection (SRS without replacement).
 *
 * Item i (0-based, population order) gets u_i, the (i+1)-th `nextDouble()` of `createRng(seed)`;
 * the sample is the `sampleSize` items with the smallest u, returned in ascending u order (ties,
 * which need two equal 53-bit doubles, go to the lower index). Runs in O(N log n) time with a
 * bounded max-heap, so a million-item population is not sorted.
 *
 * Re-performable outside Sondage: numpy `RandomState(seed).random_sample(N)` gives the same u_i.
 *
 * @param o.populationSize N, integer 1..2^31-1.
 * @param o.sampleSize n, integer 1..N.
 * @param o.seed integer 0..4294967295.
 * @returns indices 0..N-1, ascending by u.
 * @throws {TypeError} when a field is not a number.
 * @throws {RangeError} naming the field when it is out of range.
 * @example selectRandom({ populationSize: 10, sampleSize: 3, seed: 5489 }) // → [5, 2, 6]
 */
export function selectRandom(o: { populationSize: number; sampleSize: number; seed: number }): number[] {
  requireObject("options", o);
  const populationSize = requireInteger("populationSize", o.populationSize, 1, MAX_POPULATION_SIZE);
  const sampleSize = requireInteger(`sampleSize`, o.sampleSize, 1, populationSize);
  const rng = createRng(requireSeed("seed", o.seed));

  const u = new Float64Array(sampleSize);
  const idx = new Int32Array(sampleSize);
  for (let i = 0; i < sampleSize; i++) {
    u[i] = rng.nextDouble();
    idx[i] = i;
  }
  for (let i = (sampleSize >> 1) - 1; i >= 0; i--) siftDown(u, idx, sampleSize, i);
  let threshold = u[0]!;
  for (let i = sampleSize; i < populationSize; i++) {
    const ui = rng.nextDouble();
    if (ui < threshold) {
      u[0] = ui;
      idx[0] = i;
      siftDown(u, idx, sampleSize, 0);
      threshold = u[0]!;
    }
  }
  const order = Array.from(idx.keys());
  order.sort((a, b) => u[a]! - u[b]! || idx[a]! - idx[b]!);
  return order.map((k) => idx[k]!);
}
