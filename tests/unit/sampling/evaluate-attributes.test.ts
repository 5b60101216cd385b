import { describe, expect, it } from "vitest";
import stdlibBetaQuantile from "@stdlib/stats-base-dists-beta-quantile";
import stdlibBinomialCdf from "@stdlib/stats-base-dists-binomial-cdf";
import { evaluateAttributes } from "@/lib/sampling";

describe("evaluateAttributes (one-sided Clopper–Pearson)", () => {
  it.each([
    // Python 3.11.7 / scipy 1.17.1: scipy.stats.beta.ppf(1 − β, k + 1, n − k), 6 decimals
    [59, 0, 0.95, 0.049508],
    [93, 1, 0.95, 0.049994],
    [93, 2, 0.95, 0.06615],
    [150, 3, 0.95, 0.050877],
    [150, 6, 0.95, 0.077418],
    [60, 3, 0.95, 0.124187],
    [45, 0, 0.9, 0.049881],
    [77, 1, 0.9, 0.049577],
    [100, 4, 0.95, 0.089196],
  ])("n %i, k %i at %f → %f", (n, k, confidence, expected) => {
    expect(evaluateAttributes({ sampleSize: n, deviations: k, confidence }).upperLimit).toBeCloseTo(expected, 6);
  });

  it("matches R binom.test(1, 93, alternative = 'less')$conf.int[2] = 0.04999397839", () => {
    // R 4.2.2: binom.test(1, 93, alternative="less")$conf.int[2] → 0.04999397839
    expect(evaluateAttributes({ sampleSize: 93, deviations: 1, confidence: 0.95 }).upperLimit).toBeCloseTo(
      0.04999397839,
      10,
    );
  });

  it("satisfies F_Bin(k; n, UDL) = 1 − confidence and agrees with @stdlib beta quantile", () => {
    for (const n of [20, 50, 93, 150, 400]) {
      for (const k of [1, 2, 3, 5, 8]) {
        const { upperLimit } = evaluateAttributes({ sampleSize: n, deviations: k, confidence: 0.95 });
        expect(Math.abs(stdlibBinomialCdf(k, n, upperLimit) - 0.05)).toBeLessThan(1e-9);
        expect(upperLimit).toBeCloseTo(stdlibBetaQuantile(0.95, k + 1, n - k), 9);
      }
    }
  });

  it("uses 1 − β^(1/n) for zero deviations and 1 for k = n", () => {
    expect(evaluateAttributes({ sampleSize: 59, deviations: 0, confidence: 0.95 }).upperLimit).toBeCloseTo(
      1 - 0.05 ** (1 / 59),
      14,
    );
    expect(evaluateAttributes({ sampleSize: 12, deviations: 12, confidence: 0.95 }).upperLimit).toBe(1);
  });

  it.each([
    // AICPA Audit Guide Table A-3 style evaluation table (5% risk) as reproduced in a public course
    // note: printed limits equal the exact limit rounded UP to 0.1 percentage point.
    [65, 0, 0.046],
    [70, 2, 0.088],
    [75, 0, 0.04],
    [80, 3, 0.095],
    [125, 1, 0.038],
    [150, 3, 0.051],
  ])("table mode: n %i, k %i → %f", (n, k, expected) => {
    const r = evaluateAttributes({ sampleSize: n, deviations: k, confidence: 0.95, mode: "table" });
    expect(r.upperLimit).toBeCloseTo(expected, 12);
    expect(r.mode).toBe("table");
  });

  it("reports the sample rate k/n", () =>
    expect(evaluateAttributes({ sampleSize: 150, deviations: 3, confidence: 0.95 }).sampleRate).toBe(0.02));

  describe("rejects bad input", () => {
    it("deviations above sampleSize", () =>
      expect(() => evaluateAttributes({ sampleSize: 10, deviations: 11, confidence: 0.95 })).toThrow(
        /deviations must be an integer between 0 and 10/,
      ));
    it("negative deviations", () =>
      expect(() => evaluateAttributes({ sampleSize: 10, deviations: -1, confidence: 0.95 })).toThrow(/deviations/));
    it("sampleSize 0", () =>
      expect(() => evaluateAttributes({ sampleSize: 0, deviations: 0, confidence: 0.95 })).toThrow(/sampleSize/));
    it("confidence 0", () =>
      expect(() => evaluateAttributes({ sampleSize: 10, deviations: 0, confidence: 0 })).toThrow(/confidence/));
    it("an unknown mode", () =>
      expect(() =>
        evaluateAttributes({ sampleSize: 10, deviations: 0, confidence: 0.9, mode: "rounded" as "table" }),
      ).toThrow(/mode/));
  });
});
