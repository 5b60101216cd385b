/**
 * Stratified simple random selection: an independent random-number sort in each stratum.
 */
import { selectRandom } from "./select-random";
import { requireArray, requireObject, requireSeed } from "./validate";
import { EngineInputError } from "./errors";

/**
 * Stratified random selection (SRS without replacement within each stratum; Cochran 1977 ch. 5).
 *
 * Stratum h (numbered from 1 in the order given) is drawn with
 * `selectRandom({ populationSize, sampleSize, seed: (seed + h) mod 2^32 })`, so each stratum's draw
 * can be re-performed on its own. Indices are 0-based within the stratum.
 *
 * @throws {TypeError} when `strata` is not an array or a field is not a number.
 * @throws {RangeError} naming `strata[i].field` when a stratum's size is invalid, or when `strata` is empty.
 * @example
 * selectStratifiedRandom({ strata: [{ populationSize: 10, sampleSize: 3 }], seed: 5488 })
 * // → [[5, 2, 6]]  (stratum 1 uses seed 5489)
 */
export function selectStratifiedRandom(o: {
  strata: { populationSize: number; sampleSize: number }[];
  seed: number;
}): number[][] {
  requireObject("options", o);
  const strata = requireArray<{ populationSize: number; sampleSize: number }>("strata", o.strata);
  const seed = requireSeed("seed", o.seed);
  if (strata.length === 0) throw new EngineInputError("strata", "strata must contain at least one stratum");
  return strata.map((stratum, i) => {
    requireObject(`strata[${i}]`, stratum);
    const stratumSeed = (seed + i + 1) % 4294967296;
    try {
      return selectRandom({
        populationSize: stratum.populationSize,
        sampleSize: stratum.sampleSize,
        seed: stratumSeed,
      });
    } catch (error) {
      if (error instanceof EngineInputError)
        throw new EngineInputError(`strata[${i}].${error.field}`, `strata[${i}].${error.message}`);
      if (error instanceof RangeError) throw new RangeError(`strata[${i}].${error.message}`);
      if (error instanceof TypeError) throw new TypeError(`strata[${i}].${error.message}`);
      throw error;
    }
  });
}
