import { describe, expect, it } from "vitest";
import { selectRandom, selectStratifiedRandom } from "@/lib/sampling";

describe("selectStratifiedRandom", () => {
  it("draws stratum h with selectRandom and seed + h (strata numbered from 1)", () => {
    const strata = [
      { populationSize: 100, sampleSize: 10 },
      { populationSize: 40, sampleSize: 5 },
      { populationSize: 7, sampleSize: 7 },
    ];
    const result = selectStratifiedRandom({ strata, seed: 1000 });
    expect(result).toEqual(strata.map((s, i) => selectRandom({ ...s, seed: 1000 + i + 1 })));
  });

  it("wraps the stratum seed modulo 2^32", () => {
    const result = selectStratifiedRandom({ strata: [{ populationSize: 10, sampleSize: 3 }], seed: 4294967295 });
    expect(result[0]).toEqual(selectRandom({ populationSize: 10, sampleSize: 3, seed: 0 }));
  });

  describe("rejects bad input", () => {
    it("an empty strata list", () =>
      expect(() => selectStratifiedRandom({ strata: [], seed: 1 })).toThrow(/strata must contain/));
    it("a stratum with sampleSize above its populationSize, naming the stratum", () =>
      expect(() =>
        selectStratifiedRandom({
          strata: [
            { populationSize: 5, sampleSize: 2 },
            { populationSize: 3, sampleSize: 4 },
          ],
          seed: 1,
        }),
      ).toThrow(/strata\[1\]\.sampleSize/));
    it("strata that is not an array", () =>
      expect(() => selectStratifiedRandom({ strata: {} as never, seed: 1 })).toThrow(TypeError));
  });
});
