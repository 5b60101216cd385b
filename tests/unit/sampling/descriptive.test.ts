import { describe, expect, it } from "vitest";
import { mean, pairedMoments, standardDeviation } from "@/lib/sampling/descriptive";

describe("mean and standardDeviation on NIST StRD univariate data", () => {
  it("NumAcc1: certified mean 10000002, sd 1", () => {
    // NIST StRD NumAcc1 (3 observations: 10000001, 10000003, 10000002): certified mean 10000002, sd 1.
    const values = [10000001, 10000003, 10000002];
    expect(mean(values)).toBe(10000002);
    expect(standardDeviation(values)).toBeCloseTo(1, 12);
  });

  // NumAcc2–4 as constructed by NIST StRD (from memory for the exact digits): 1001 values, the
  // first c + 0.2, then c + 0.1 and c + 0.3 alternating. Mean c + 0.2 and sd 0.1 follow by
  // arithmetic (1000 deviations of ±0.1, divisor 1000). NIST certifies sd 0.1 for these sets.
  const numAcc = (c: number) => [c + 0.2, ...Array.from({ length: 1000 }, (_, i) => (i % 2 === 0 ? c + 0.1 : c + 0.3))];
  it.each([
    ["NumAcc2-like", 1, 1.2],
    ["NumAcc3-like", 1000000, 1000000.2],
    ["NumAcc4-like", 10000000, 10000000.2],
  ])("%s: mean and sd 0.1 to the precision the data carry", (_name, c, certifiedMean) => {
    const values = numAcc(c);
    expect(mean(values)).toBeCloseTo(certifiedMean, 8);
    // NumAcc4's values carry ~1e-9 representation error, so 8 significant digits of sd 0.1 is the standard to meet.
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
