import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { createRng, selectRandom } from "@/lib/sampling";

/** Independent re-performance: sort every item by its u (a full sort, unlike the engine's heap). */
function bySort(populationSize: number, sampleSize: number, seed: number): number[] {
  const rng = createRng(seed);
  const u = Array.from({ length: populationSize }, () => rng.nextDouble());
  return u
    .map((_, i) => i)
    .sort((a, b) => u[a] - u[b] || a - b)
    .slice(0, sampleSize);
}

describe("selectRandom (random-number sort)", () => {
  it("re-performs numpy: argsort of RandomState(5489).random_sample(10), first 3", () => {
    // Debian numpy 1.24.2: np.argsort(np.random.RandomState(5489).random_sample(10))[:3] → [5, 2, 6]
    expect(selectRandom({ populationSize: 10, sampleSize: 3, seed: 5489 })).toEqual([5, 2, 6]);
  });

  it("equals the full sort of the random-number column for a larger population", () => {
    expect(selectRandom({ populationSize: 5000, sampleSize: 120, seed: 20240101 })).toEqual(
      bySort(5000, 120, 20240101),
    );
  });

  it("returns the whole population when n = N, in u order", () => {
    expect(selectRandom({ populationSize: 50, sampleSize: 50, seed: 3 })).toEqual(bySort(50, 50, 3));
  });

  it("property: no duplicates, all in range, length n, and equal to the full sort", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 400 }),
        fc.integer({ min: 0, max: 4294967295 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (N, seed, share) => {
          const n = Math.max(1, Math.round(share * N));
          const picks = selectRandom({ populationSize: N, sampleSize: n, seed });
          expect(picks).toHaveLength(n);
          expect(new Set(picks).size).toBe(n);
          expect(picks.every((i) => Number.isInteger(i) && i >= 0 && i < N)).toBe(true);
          expect(picks).toEqual(bySort(N, n, seed));
        },
      ),
      { numRuns: 150 },
    );
  });

  it("property: the same seed gives the same sample, a different seed a different one", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 4294967294 }), (seed) => {
        const a = selectRandom({ populationSize: 1000, sampleSize: 30, seed });
        expect(selectRandom({ populationSize: 1000, sampleSize: 30, seed })).toEqual(a);
        expect(selectRandom({ populationSize: 1000, sampleSize: 30, seed: seed + 1 })).not.toEqual(a);
      }),
      { numRuns: 50 },
    );
  });

  describe("rejects bad input", () => {
    it("sampleSize above populationSize", () =>
      expect(() => selectRandom({ populationSize: 10, sampleSize: 11, seed: 1 })).toThrow(
        /sampleSize must be an integer between 1 and 10/,
      ));
    it("sampleSize 0", () =>
      expect(() => selectRandom({ populationSize: 10, sampleSize: 0, seed: 1 })).toThrow(RangeError));
    it("fractional populationSize", () =>
      expect(() => selectRandom({ populationSize: 10.5, sampleSize: 2, seed: 1 })).toThrow(/populationSize/));
    it("negative seed", () =>
      expect(() => selectRandom({ populationSize: 10, sampleSize: 2, seed: -3 })).toThrow(/seed/));
    it("missing options object", () =>
      expect(() => selectRandom(null as unknown as Parameters<typeof selectRandom>[0])).toThrow(TypeError));
    it("string sampleSize", () =>
      expect(() => selectRandom({ populationSize: 10, sampleSize: "2" as unknown as number, seed: 1 })).toThrow(
        TypeError,
      ));
  });
});
