import { describe, expect, it } from "vitest";
import { musSampleSize } from "@/lib/sampling";

describe("musSampleSize", () => {
  it("BV 2,740,000, TM 90,000, EM 15,000, 95%: n 125, interval 21,920", () => {
    // AICPA Audit Guide "Audit Sampling" formula n = BV·RF/(TM − EM·EF), EF 1.6 at 95% (from memory):
    // 2,740,000 × 2.995732 / (90,000 − 24,000) = 124.37 → 125; interval 2,740,000/125 = 21,920
    // (Python 3.11.7 computation in the methods reference; with RF 3.00 the raw n is 124.545).
    const r = musSampleSize({ bookValue: 2740000, tolerableMisstatement: 90000, expectedMisstatement: 15000, confidence: 0.95 });
    expect(r.sampleSize).toBe(125);
    expect(r.interval).toBe(21920);
    expect(r.expansionFactor).toBe(1.6);
    expect(r.reliabilityFactor).toBeCloseTo(2.995732, 6);
  });

  it("BV 300,000, TM 15,000, EM 6,000, 95%: n 167", () => {
    // Same formula: 300,000 × 2.995732 / (15,000 − 9,600) = 166.43 → 167 (166.67 with RF 3.00);
    // interval floor(300,000 / 167) = 1,796.
    const r = musSampleSize({ bookValue: 300000, tolerableMisstatement: 15000, expectedMisstatement: 6000, confidence: 0.95 });
    expect(r.sampleSize).toBe(167);
    expect(r.interval).toBe(1796);
  });

  it("with no expected misstatement: BV 300,000, TM 15,000, 95% → n 60", () => {
    // 300,000 × 2.995732 / 15,000 = 59.91 → 60.
    expect(musSampleSize({ bookValue: 300000, tolerableMisstatement: 15000, expectedMisstatement: 0, confidence: 0.95 }).sampleSize).toBe(60);
  });

  it("BV 1,000,000, TM 50,000, EM 10,000, 90% (EF 1.5): n 66", () => {
    // 1,000,000 × 2.302585 / (50,000 − 15,000) = 65.79 → 66.
    expect(musSampleSize({ bookValue: 1000000, tolerableMisstatement: 50000, expectedMisstatement: 10000, confidence: 0.9 }).sampleSize).toBe(66);
  });

  describe("rejects bad input", () => {
    it("TM <= EM × EF (infeasible)", () =>
      expect(() => musSampleSize({ bookValue: 1e6, tolerableMisstatement: 16000, expectedMisstatement: 10000, confidence: 0.95 })).toThrow(/tolerableMisstatement \(16000\) must exceed expectedMisstatement × expansion factor/));
    it("a confidence with no tabled expansion factor when EM > 0", () =>
      expect(() => musSampleSize({ bookValue: 1e6, tolerableMisstatement: 50000, expectedMisstatement: 1000, confidence: 0.97 })).toThrow(/no tabled expansion factor/));
    it("a negative expected misstatement", () =>
      expect(() => musSampleSize({ bookValue: 1e6, tolerableMisstatement: 50000, expectedMisstatement: -1, confidence: 0.95 })).toThrow(/expectedMisstatement/));
    it("tolerable misstatement above the book value", () =>
      expect(() => musSampleSize({ bookValue: 1000, tolerableMisstatement: 5000, expectedMisstatement: 0, confidence: 0.95 })).toThrow(/must not exceed bookValue/));
    it("a zero book value", () =>
      expect(() => musSampleSize({ bookValue: 0, tolerableMisstatement: 1, expectedMisstatement: 0, confidence: 0.95 })).toThrow(/bookValue must be greater than zero/));
  });
});
