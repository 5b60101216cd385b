import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { createRng, selectSystematic } from "@/lib/sampling";

describe("selectSystematic", () => {
  it("picks floor(s + j k) with s = u_0 k", () => {
    // k = 10/3, u_0 = 0.8147236863931789 (numpy RandomState(5489).random_sample()) → s = 2.7157…
    // picks floor(2.7157), floor(6.049), floor(9.382) = 2, 6, 9 (hand computation).
    expect(selectSystematic({ populationSize: 10, sampleSize: 3, seed: 5489 })).toEqual([2, 6, 9]);
  });

  it("takes every item when n = N", () => {
    expect(selectSystematic({ populationSize: 7, sampleSize: 7, seed: 11 })).toEqual([0, 1, 2, 3, 4, 5, 6]);
  });

  it("property: ascending, distinct, in range, gaps of floor(k) or ceil(k)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 5000 }),
        fc.integer({ min: 0, max: 4294967295 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (N, seed, share) => {
          const n = Math.max(1, Math.round(share * N));
          const picks = selectSystematic({ populationSize: N, sampleSize: n, seed });
          const k = N / n;
          expect(picks).toHaveLength(n);
          expect(picks[0]).toBe(Math.floor(createRng(seed).nextDouble() * k));
          for (let j = 1; j < n; j++) {
            const gap = picks[j] - picks[j - 1];
            expect(gap === Math.floor(k) || gap === Math.ceil(k)).toBe(true);
          }
          expect(picks[n - 1]).toBeLessThan(N);
        },
      ),
      { numRuns: 200 },
    );
  });

  describe("rejects bad input", () => {
    it("sampleSize above populationSize", () =>
      expect(() => selectSystematic({ populationSize: 5, sampleSize: 6, seed: 1 })).toThrow(/sampleSize/));
    it("populationSize 0", () =>
      expect(() => selectSystematic({ populationSize: 0, sampleSize: 1, seed: 1 })).toThrow(/populationSize/));
    it("seed above 2^32 - 1", () =>
      expect(() => selectSystematic({ populationSize: 5, sampleSize: 1, seed: 2 ** 32 })).toThrow(/seed/));
  });
});
