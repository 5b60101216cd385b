import { describe, expect, it } from "vitest";
import { mean, pairedMoments, standardDeviation } from "@/lib/sampling/descriptive";

describe("mean and standardDeviation on NIST StRD univariate data", () => {
  // NIST Statistical Reference Datasets, univariate summary statistics (itl.nist.gov/div898/strd/univ),
  // constructed by NIST after Simon and Lesage (1989), Computational Statistics & Data Analysis 8, 325-332.
  it("NumAcc1: certified mean 10000002 (exact), sd 1 (exact)", () => {
    // NumAcc1.dat, data lines 61 to 63: three 8-digit integers differing in the last digit.
    const values = [10000001, 10000003, 10000002];
    expect(mean(values)).toBe(10000002);
    expect(standardDeviation(values)).toBeCloseTo(1, 12);
  });

  // NumAcc2.dat, NumAcc3.dat and NumAcc4.dat, data lines 61 to 1061 (1001 values): a single c + 0.2
  // followed by 500 pairings of c + 0.1 and c + 0.3, with c = 1, 1000000 and 10000000. The data lines
  // are that construction, so they are built here rather than typed out 1001 times. Certified values:
  // mean c + 0.2 (exact), standard deviation 0.1 (exact), lag-1 autocorrelation -0.999 (exact).
  const numAcc = (c: number) => [c + 0.2, ...Array.from({ length: 1000 }, (_, i) => (i % 2 === 0 ? c + 0.1 : c + 0.3))];
  it.each([
    ["NumAcc2", 1, 1.2],
    ["NumAcc3", 1000000, 1000000.2],
    ["NumAcc4", 10000000, 10000000.2],
  ])("%s: the certified mean and sd 0.1 to the precision the data carry", (_name, c, certifiedMean) => {
    const values = numAcc(c);
    expect(values).toHaveLength(1001);
    expect(mean(values)).toBeCloseTo(certifiedMean, 8);
    // NumAcc4's values carry ~1e-9 representation error in binary floating point, so 8 significant
    // digits of sd 0.1 is the standard to meet (NIST grades by log relative error).
    expect(standardDeviation(values)).toBeCloseTo(0.1, 8);
  });

  it("rejects an empty list and a single value", () => {
    expect(() => mean([])).toThrow(RangeError);
    expect(() => standardDeviation([1])).toThrow(RangeError);
  });
  it("rejects a non-finite value", () => expect(() => mean([1, Number.NaN])).toThrow(/values\[1\]/));
});

describe("pairedMoments", () => {
  it("gives exact cent totals and the covariance of book and difference", () => {
    // Hand computation: x = (100, 200, 300), y = (100, 190, 300): d = (0, −10, 0), mean d −10/3;
    // s_xd = Σ(x − 200)(d − d̄)/2 = 0.
    const m = pairedMoments([100, 200, 300], [100, 190, 300]);
    expect(m.sumX).toBe(600);
    expect(m.sumY).toBe(590);
    expect(m.nonZeroDifferences).toBe(1);
    expect(m.covXD).toBeCloseTo(0, 12);
    expect(m.varX).toBe(10000);
  });
});
