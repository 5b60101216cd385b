import { describe, expect, it } from "vitest";
import { musSampleSize } from "@/lib/sampling";

describe("musSampleSize, expansion-factor method (the older Guide presentation)", () => {
  it("BV 2,740,000, TM 90,000, EM 15,000, 95%: n 125, interval 21,920", () => {
    // AICPA Audit Guide "Audit Sampling" formula n = BV·RF/(TM − EM·EF), EF 1.6 at 95% (from memory):
    // 2,740,000 × 2.995732 / (90,000 − 24,000) = 124.37 → 125; interval 2,740,000/125 = 21,920
    // (Python 3.11.7 computation in the methods reference; with RF 3.00 the raw n is 124.545).
    const r = musSampleSize({
      bookValue: 2740000,
      tolerableMisstatement: 90000,
      expectedMisstatement: 15000,
      confidence: 0.95,
      method: "expansion-factor",
    });
    expect(r.sampleSize).toBe(125);
    expect(r.interval).toBe(21920);
    expect(r.expansionFactor).toBe(1.6);
    expect(r.reliabilityFactor).toBeCloseTo(2.995732, 6);
  });

  it("BV 300,000, TM 15,000, EM 6,000, 95%: n 167", () => {
    // Same formula: 300,000 × 2.995732 / (15,000 − 9,600) = 166.43 → 167 (166.67 with RF 3.00);
    // interval floor(300,000 / 167) = 1,796.
    const r = musSampleSize({
      bookValue: 300000,
      tolerableMisstatement: 15000,
      expectedMisstatement: 6000,
      confidence: 0.95,
      method: "expansion-factor",
    });
    expect(r.sampleSize).toBe(167);
    expect(r.interval).toBe(1796);
  });

  it("with no expected misstatement: BV 300,000, TM 15,000, 95% → n 60", () => {
    // 300,000 × 2.995732 / 15,000 = 59.91 → 60.
    expect(
      musSampleSize({
        bookValue: 300000,
        tolerableMisstatement: 15000,
        expectedMisstatement: 0,
        confidence: 0.95,
        method: "expansion-factor",
      }).sampleSize,
    ).toBe(60);
  });

  it("BV 1,000,000, TM 50,000, EM 10,000, 90% (EF 1.5): n 66", () => {
    // 1,000,000 × 2.302585 / (50,000 − 15,000) = 65.79 → 66.
    expect(
      musSampleSize({
        bookValue: 1000000,
        tolerableMisstatement: 50000,
        expectedMisstatement: 10000,
        confidence: 0.9,
        method: "expansion-factor",
      }).sampleSize,
    ).toBe(66);
  });

  describe("rejects bad input", () => {
    it("TM <= EM × EF (infeasible)", () =>
      expect(() =>
        musSampleSize({
          bookValue: 1e6,
          tolerableMisstatement: 16000,
          expectedMisstatement: 10000,
          confidence: 0.95,
          method: "expansion-factor",
        }),
      ).toThrow(/tolerableMisstatement \(16000\) must exceed expectedMisstatement × expansion factor/));
    it("a confidence with no tabled expansion factor when EM > 0", () =>
      expect(() =>
        musSampleSize({
          bookValue: 1e6,
          tolerableMisstatement: 50000,
          expectedMisstatement: 1000,
          confidence: 0.97,
          method: "expansion-factor",
        }),
      ).toThrow(/no tabled expansion factor/));
    it("a negative expected misstatement", () =>
      expect(() =>
        musSampleSize({
          bookValue: 1e6,
          tolerableMisstatement: 50000,
          expectedMisstatement: -1,
          confidence: 0.95,
          method: "expansion-factor",
        }),
      ).toThrow(/expectedMisstatement/));
    it("tolerable misstatement above the book value", () =>
      expect(() =>
        musSampleSize({
          bookValue: 1000,
          tolerableMisstatement: 5000,
          expectedMisstatement: 0,
          confidence: 0.95,
          method: "expansion-factor",
        }),
      ).toThrow(/must not exceed bookValue/));
    it("a zero book value", () =>
      expect(() =>
        musSampleSize({
          bookValue: 0,
          tolerableMisstatement: 1,
          expectedMisstatement: 0,
          confidence: 0.95,
          method: "expansion-factor",
        }),
      ).toThrow(/bookValue must be greater than zero/));
  });
});

describe("musSampleSize, confidence-factor method (default; the Guide's presentation from 2008)", () => {
  it("BV 2,740,000, TM 90,000, EM 15,000, 95%: R 4.267711, n 130, interval 21,076", () => {
    // scipy 1.17.1: brentq(lambda R: gamma.ppf(0.95, 1 + R/6) - R, ...) = 4.267710516814435;
    // n = ceil(4.2677105 × 2,740,000 / 90,000) = ceil(129.928) = 130; interval floor(2,740,000/130) = 21,076.
    const r = musSampleSize({
      bookValue: 2740000,
      tolerableMisstatement: 90000,
      expectedMisstatement: 15000,
      confidence: 0.95,
    });
    expect(r).toMatchObject({ sampleSize: 130, interval: 21076, method: "confidence-factor", mode: "exact" });
    expect(r.confidenceFactor).toBeCloseTo(4.267711, 6);
    expect(r.expansionFactor).toBeUndefined();
  });

  it("table mode rounds R up to 2 decimals (4.27) and says so", () => {
    // 4.27 × 2,740,000 / 90,000 = 129.998 → 130.
    const r = musSampleSize({
      bookValue: 2740000,
      tolerableMisstatement: 90000,
      expectedMisstatement: 15000,
      confidence: 0.95,
      mode: "table",
    });
    expect(r).toMatchObject({ sampleSize: 130, mode: "table", confidenceFactor: 4.27, reliabilityFactor: 3 });
  });

  it("EM 0 uses RF(0): BV 300,000, TM 15,000, 95% → R 2.995732, n 60 (table: 3.00 → 60)", () => {
    // 300,000 × 2.995732 / 15,000 = 59.91 → 60; 3.00 × 20 = 60 exactly.
    const exact = musSampleSize({
      bookValue: 300000,
      tolerableMisstatement: 15000,
      expectedMisstatement: 0,
      confidence: 0.95,
    });
    expect(exact.sampleSize).toBe(60);
    expect(exact.confidenceFactor).toBeCloseTo(2.995732, 6);
    expect(
      musSampleSize({
        bookValue: 300000,
        tolerableMisstatement: 15000,
        expectedMisstatement: 0,
        confidence: 0.95,
        mode: "table",
      }).sampleSize,
    ).toBe(60);
  });

  it("EM/TM 0.4 at 95% (R 8.086363): BV 1,000,000, TM 50,000 → n 162", () => {
    // scipy root 8.086363; 8.086363 × 20 = 161.73 → 162. The expansion-factor method gives
    // 1,000,000 × 2.995732 / (50,000 − 32,000) = 166.43 → 167.
    expect(
      musSampleSize({ bookValue: 1e6, tolerableMisstatement: 50000, expectedMisstatement: 20000, confidence: 0.95 })
        .sampleSize,
    ).toBe(162);
    expect(
      musSampleSize({
        bookValue: 1e6,
        tolerableMisstatement: 50000,
        expectedMisstatement: 20000,
        confidence: 0.95,
        method: "expansion-factor",
      }).sampleSize,
    ).toBe(167);
  });

  it("works at confidences the expansion-factor table lacks (97%)", () => {
    const r = musSampleSize({
      bookValue: 1e6,
      tolerableMisstatement: 50000,
      expectedMisstatement: 5000,
      confidence: 0.97,
    });
    expect(r.sampleSize).toBe(Math.ceil((r.confidenceFactor * 1e6) / 50000 - 1e-9));
  });

  describe("refuses", () => {
    it("EM ≥ TM, naming both fields", () =>
      expect(() =>
        musSampleSize({ bookValue: 1e6, tolerableMisstatement: 50000, expectedMisstatement: 50000, confidence: 0.95 }),
      ).toThrow(/expectedMisstatement \(50000\) must be below tolerableMisstatement \(50000\)/));
    it("EM so close to TM that no confidence factor exists, naming both fields", () =>
      expect(() =>
        musSampleSize({
          bookValue: 1e9,
          tolerableMisstatement: 50000,
          expectedMisstatement: 49999.99,
          confidence: 0.95,
        }),
      ).toThrow(/expectedMisstatement .* too close to tolerableMisstatement/));
    it("an unknown method", () =>
      expect(() =>
        musSampleSize({
          bookValue: 1e6,
          tolerableMisstatement: 50000,
          expectedMisstatement: 0,
          confidence: 0.95,
          method: "guess" as "confidence-factor",
        }),
      ).toThrow(/method must be one of/));
  });
});
