import { describe, expect, it } from "vitest";
import { neymanAllocation, stratifiedSampleSize } from "@/lib/sampling";

// Cochran, Sampling Techniques (1977) ch. 5, Neyman allocation; worked with Python 3.11.7 in the methods reference.
const STRATA = [
  { populationSize: 100, standardDeviation: 2000 },
  { populationSize: 400, standardDeviation: 400 },
  { populationSize: 1500, standardDeviation: 80 },
];

describe("neymanAllocation", () => {
  it("N_h (100, 400, 1500), S_h (2000, 400, 80), n 150: n_h 62.5 / 50 / 37.5, SE 32,594.4781", () => {
    // Python: n_h = n N_h S_h / Σ N_j S_j; SE = sqrt((Σ N_h S_h)²/n − Σ N_h S_h²) = 32,594.4781.
    const r = neymanAllocation({ strata: STRATA, sampleSize: 150 });
    expect(r.exactAllocation).toEqual([62.5, 50, 37.5]);
    expect(r.standardError).toBeCloseTo(32594.4781, 3);
  });

  it("rounds by largest remainder, ties to the earlier stratum, keeping Σ n_h = n", () => {
    // Implementation choice (the reference leaves rounding open): remainders .5/.0/.5 → the first stratum gets the extra unit.
    expect(neymanAllocation({ strata: STRATA, sampleSize: 150 }).allocation).toEqual([63, 50, 37]);
  });

  it("takes a stratum 100% when its share exceeds its size and reallocates the rest", () => {
    // Share of stratum 1: 50 × 50,000/60,000 = 41.7 > 10 → n_1 = 10, the remaining 40 go to stratum 2.
    const r = neymanAllocation({
      strata: [
        { populationSize: 10, standardDeviation: 5000 },
        { populationSize: 1000, standardDeviation: 10 },
      ],
      sampleSize: 50,
    });
    expect(r.allocation).toEqual([10, 40]);
  });

  it("keeps at least 2 per stratum so each has a variance estimate", () => {
    const r = neymanAllocation({
      strata: [
        { populationSize: 1000, standardDeviation: 1000 },
        { populationSize: 1000, standardDeviation: 1 },
      ],
      sampleSize: 40,
    });
    expect(r.allocation).toEqual([38, 2]);
  });

  describe("rejects bad input", () => {
    it("a sample smaller than 2 per stratum", () =>
      expect(() => neymanAllocation({ strata: STRATA, sampleSize: 5 })).toThrow(
        /sampleSize must be an integer between 6 and 2000/,
      ));
    it("a negative standard deviation, naming the stratum", () =>
      expect(() =>
        neymanAllocation({ strata: [{ populationSize: 10, standardDeviation: -1 }], sampleSize: 2 }),
      ).toThrow(/strata\[0\]\.standardDeviation/));
    it("an empty strata list", () =>
      expect(() => neymanAllocation({ strata: [], sampleSize: 2 })).toThrow(/strata must contain/));
  });
});

describe("stratifiedSampleSize", () => {
  it("allowance 60,000 at 95% two-sided: n = 480,000² / (V + Σ N_h S_h²) = 163.32 → 164", () => {
    // Python: V = (60000/1.959964)² = 937,143,977.86; 230,400,000,000/(937,143,977.86 + 473,600,000) = 163.3181.
    const r = stratifiedSampleSize({ strata: STRATA, plannedAllowance: 60000, confidence: 0.95 });
    expect(r.exactSampleSize).toBeCloseTo(163.3181, 4);
    expect(r.sampleSize).toBe(164);
    expect(r.allocation.reduce((a, b) => a + b, 0)).toBe(164);
    expect(r.allocatedStandardError).toBeLessThanOrEqual(60000 / 1.959963984540054);
  });

  it("rejects a zero allowance", () =>
    expect(() => stratifiedSampleSize({ strata: STRATA, plannedAllowance: 0, confidence: 0.95 })).toThrow(
      /plannedAllowance/,
    ));
  it("rejects an unknown sides value", () =>
    expect(() =>
      stratifiedSampleSize({ strata: STRATA, plannedAllowance: 100, confidence: 0.95, sides: "upper" as "one" }),
    ).toThrow(/sides/));
});
