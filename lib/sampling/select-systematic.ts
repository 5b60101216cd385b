/**
 * Systematic selection with a random start (common practice; Cochran 1977 ch. 8 for the design).
 */
import { createRng } from "./rng";
import { MAX_POPULATION_SIZE } from "./select-random";
import { requireInteger, requireObject, requireSeed } from "./validate";

/**
 * Systematic item selection with one random start and a real-valued step.
 *
 * Step k = N / n; start s = u_0 · k with u_0 the first `nextDouble()` of `createRng(seed)`; the
 * picks are floor(s + j·k) for j = 0..n-1 (0-based indices in population order, ascending). With a
 * real step every item has inclusion probability exactly n/N. The outcome depends on file order:
 * record the order with the selection.
 *
 * @throws {TypeError} when a field is not a number.
 * @throws {RangeError} naming the field when it is out of range.
 * @example selectSystematic({ populationSize: 10, sampleSize: 3, seed: 5489 }) // → [2, 6, 9]
 */
export function selectSystematic(o: { populationSize: number; sampleSize: number; seed: number }): number[] {
  requireObject("options", o);
  const populationSize = requireInteger("populationSize", o.populationSize, 1, MAX_POPULATION_SIZE);
  const sampleSize = requireInteger("sampleSize", o.sampleSize, 1, populationSize);
  const rng = createRng(requireSeed("seed", o.seed));
  const step = populationSize / sampleSize;
  const start = rng.nextDouble() * step;
  const picks = new Array<number>(sampleSize);
  for (let j = 0; j < sampleSize; j++) {
    // s + j·k < n·k = N in exact arithmetic; the clamp guards the last pick against rounding.
    picks[j] = Math.min(populationSize - 1, Math.floor(start + j * step));
  }
  return picks;
}
