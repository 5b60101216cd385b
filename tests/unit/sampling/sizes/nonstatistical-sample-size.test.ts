import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { nonstatisticalSampleSize } from "@/lib/sampling";

// Formula: n = (BV excluding items examined 100 % ÷ TM) × assurance factor (AICPA Audit Guide "Audit Sampling",
// nonstatistical sampling chapter, as commonly reproduced — from memory). The figures below are the formula's own arithmetic.
describe("nonstatisticalSampleSize", () => {
  it("sizes on the book value less the key items", () => {
    // (1,000,000 − 300,000) ÷ 50,000 × 3.0 = 42 exactly — not 43 from a floating-point residue.
    const r = nonstatisticalSampleSize({
      bookValue: 1000000,
      keyItemsBookValue: 300000,
      tolerableMisstatement: 50000,
      assuranceFactor: 3,
    });
    expect(r).toEqual({
      sampleSize: 42,
      exactSize: 42,
      remainderBookValue: 700000,
      effectiveTolerable: 50000,
      raisedToMinimum: false,
      warnings: [],
    });
  });

  it("rounds up a fractional size", () => {
    // 2,740,000 ÷ 90,000 × 2.3 = 70.022… → 71.
    const r = nonstatisticalSampleSize({ bookValue: 2740000, tolerableMisstatement: 90000, assuranceFactor: 2.3 });
    expect(r.sampleSize).toBe(71);
    expect(r.exactSize).toBeCloseTo(70.0222222, 6);
  });

  it("a factor that floats badly still gives the exact whole size", () => {
    // 0.1 + 0.2 style residue: 300,000 ÷ 100,000 × 2.3 = 6.9 → 7; 100,000 ÷ 10,000 × 1.1 = 11 exactly (11.000000000000002 in binary floating point).
    expect(
      nonstatisticalSampleSize({ bookValue: 300000, tolerableMisstatement: 100000, assuranceFactor: 2.3 }).sampleSize,
    ).toBe(7);
    expect(
      nonstatisticalSampleSize({ bookValue: 100000, tolerableMisstatement: 10000, assuranceFactor: 1.1 }).sampleSize,
    ).toBe(11);
  });

  it("expected misstatement: none warns, subtract-from-tolerable uses TM − EM (firm setting)", () => {
    const none = nonstatisticalSampleSize({
      bookValue: 700000,
      tolerableMisstatement: 50000,
      assuranceFactor: 3,
      expectedMisstatement: 10000,
    });
    expect(none.sampleSize).toBe(42);
    expect(none.warnings[0]).toMatch(/increase the size by judgement/);
    // 700,000 ÷ 40,000 × 3 = 52.5 → 53 (common practice adjustment).
    const sub = nonstatisticalSampleSize({
      bookValue: 700000,
      tolerableMisstatement: 50000,
      assuranceFactor: 3,
      expectedMisstatement: 10000,
      expectedMisstatementAdjustment: "subtract-from-tolerable",
    });
    expect(sub.sampleSize).toBe(53);
    expect(sub.effectiveTolerable).toBe(40000);
    expect(sub.warnings).toEqual([]);
  });

  it("the firm minimum raises a smaller size and says so", () => {
    const r = nonstatisticalSampleSize({
      bookValue: 100000,
      tolerableMisstatement: 50000,
      assuranceFactor: 1,
      minimumSampleSize: 10,
    });
    expect(r.sampleSize).toBe(10);
    expect(r.raisedToMinimum).toBe(true);
  });

  it("nothing to sample when every item is a key item", () => {
    const r = nonstatisticalSampleSize({
      bookValue: 500,
      keyItemsBookValue: 500,
      tolerableMisstatement: 50,
      assuranceFactor: 3,
      minimumSampleSize: 10,
    });
    expect(r.sampleSize).toBe(0);
    expect(r.warnings[0]).toMatch(/nothing is left to sample/);
  });

  it("refuses bad input naming the field", () => {
    expect(() => nonstatisticalSampleSize({ bookValue: 0, tolerableMisstatement: 1, assuranceFactor: 1 })).toThrow(
      /^bookValue must be greater than zero/,
    );
    expect(() =>
      nonstatisticalSampleSize({ bookValue: 10, keyItemsBookValue: 11, tolerableMisstatement: 1, assuranceFactor: 1 }),
    ).toThrow(/^keyItemsBookValue must not exceed/);
    expect(() => nonstatisticalSampleSize({ bookValue: 10, tolerableMisstatement: -1, assuranceFactor: 1 })).toThrow(
      /^tolerableMisstatement/,
    );
    expect(() => nonstatisticalSampleSize({ bookValue: 10, tolerableMisstatement: 1, assuranceFactor: 0 })).toThrow(
      /^assuranceFactor/,
    );
    expect(() => nonstatisticalSampleSize({ bookValue: 10, tolerableMisstatement: 1, assuranceFactor: 11 })).toThrow(
      /^assuranceFactor must be at most 10/,
    );
    expect(() =>
      nonstatisticalSampleSize({
        bookValue: 10,
        tolerableMisstatement: 5,
        assuranceFactor: 1,
        expectedMisstatement: 5,
        expectedMisstatementAdjustment: "subtract-from-tolerable",
      }),
    ).toThrow(/^tolerableMisstatement must exceed expectedMisstatement/);
  });

  it("the size never falls as the factor rises or TM falls (property)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 1e9 }),
        fc.integer({ min: 1, max: 1e8 }),
        fc.integer({ min: 1, max: 30 }),
        (bookCents, tmCents, f10) => {
          const base = { bookValue: bookCents / 100, tolerableMisstatement: tmCents / 100 };
          const a = nonstatisticalSampleSize({ ...base, assuranceFactor: f10 / 10 }).sampleSize;
          const b = nonstatisticalSampleSize({ ...base, assuranceFactor: (f10 + 1) / 10 }).sampleSize;
          expect(b).toBeGreaterThanOrEqual(a);
          expect(a).toBe(Math.ceil((bookCents * f10) / (tmCents * 10) - 1e-12));
        },
      ),
    );
  });
});
