import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { evaluateMus } from "@/lib/sampling";
import { MUS_EXAMPLE_SAMPLE, MUS_EXAMPLE_TOP } from "./fixtures";

// Worked Stringer-bound example (AICPA Audit Guide "Audit Sampling" method; figures computed with
// Python 3.11.7 in the methods reference, script mus_eval.py): interval 21,920, 95% confidence,
// sampled items A17, A42, A63, A88 (overstated) and A95 (understated), top-stratum item T3.
const EXAMPLE = { interval: 21920, confidence: 0.95, sample: MUS_EXAMPLE_SAMPLE, topStratum: MUS_EXAMPLE_TOP };

describe("evaluateMus (Stringer bound)", () => {
  it("example A with table factors (3.00, 4.75, 6.30, 7.76, 9.16)", () => {
    // Python mus_eval.py: BP 65,760.00; PM 32,880.00 + top 1,500 = 34,380.00; IA 21,909.04;
    // UML_over 122,049.04; UML_under 71,514.00; net MLE 31,092.00; net UML 118,761.04 / 37,134.00.
    const r = evaluateMus({ ...EXAMPLE, factors: "table" });
    expect(r.factorMode).toBe("table");
    expect(r.overstatement.basicPrecision).toBeCloseTo(65760, 2);
    expect(r.overstatement.projected).toBeCloseTo(34380, 2);
    expect(r.overstatement.topStratumMisstatement).toBe(1500);
    expect(r.overstatement.incrementalAllowance).toBeCloseTo(21909.04, 2);
    expect(r.overstatement.upperLimit).toBeCloseTo(122049.04, 2);
    expect(r.overstatement.taintings).toEqual([1, 0.25, 0.2, 0.05]);
    expect(r.understatement.projected).toBeCloseTo(3288, 2);
    expect(r.understatement.incrementalAllowance).toBeCloseTo(2466, 2);
    expect(r.understatement.upperLimit).toBeCloseTo(71514, 2);
    expect(r.understatement.taintings).toEqual([0.15]);
    expect(r.mostLikelyMisstatement).toBeCloseTo(31092, 2);
    expect(r.netUpperLimits.overstatement).toBeCloseTo(118761.04, 2);
    expect(r.netUpperLimits.understatement).toBeCloseTo(37134, 2);
    expect(r.warnings).toEqual([]);
  });

  it("example A with exact gamma factors", () => {
    // Python mus_eval.py (scipy gamma.ppf factors 2.995732, 4.743865, 6.295794, 7.753657, 9.153519):
    // BP 65,666.4514; IA 21,869.1506; UML_over 121,915.6020; UML_under 71,414.3103;
    // net UML_over 118,627.6020; net UML_under 37,034.3103.
    const r = evaluateMus(EXAMPLE);
    expect(r.factorMode).toBe("exact");
    expect(r.overstatement.basicPrecision).toBeCloseTo(65666.4514, 3);
    expect(r.overstatement.incrementalAllowance).toBeCloseTo(21869.1506, 3);
    expect(r.overstatement.upperLimit).toBeCloseTo(121915.602, 3);
    expect(r.understatement.upperLimit).toBeCloseTo(71414.3103, 3);
    expect(r.netUpperLimits.overstatement).toBeCloseTo(118627.602, 3);
    expect(r.netUpperLimits.understatement).toBeCloseTo(37034.3103, 3);
  });

  it("example B (one tainting of 0.20): UML 73,432.00 with table factors, 73,330.2632 exact", () => {
    // Python: 65,760.00 + 4,384.00 + (1.75 − 1) × 0.20 × 21,920 = 73,432.00 → at or below TM 90,000.
    const sample = [{ bookValue: 5480, auditedValue: 4384 }];
    expect(
      evaluateMus({ interval: 21920, confidence: 0.95, sample, factors: "table" }).overstatement.upperLimit,
    ).toBeCloseTo(73432, 2);
    expect(evaluateMus({ interval: 21920, confidence: 0.95, sample }).overstatement.upperLimit).toBeCloseTo(
      73330.2632,
      3,
    );
  });

  it("zero errors: both limits equal basic precision, 65,760.00 (table) or 65,666.45 (exact)", () => {
    const table = evaluateMus({
      interval: 21920,
      confidence: 0.95,
      sample: [{ bookValue: 100, auditedValue: 100 }],
      factors: "table",
    });
    expect(table.overstatement.upperLimit).toBeCloseTo(65760, 2);
    expect(table.understatement.upperLimit).toBeCloseTo(65760, 2);
    expect(table.mostLikelyMisstatement).toBe(0);
    expect(evaluateMus({ interval: 21920, confidence: 0.95, sample: [] }).overstatement.upperLimit).toBeCloseTo(
      65666.45,
      2,
    );
  });

  it("takes top-stratum misstatement at its actual amount, with no allowance", () => {
    // Common practice (AICPA guide; Leslie et al. 1979, from memory): top-stratum errors add 1:1.
    const without = evaluateMus({ interval: 21920, confidence: 0.95, sample: MUS_EXAMPLE_SAMPLE, factors: "table" });
    const withTop = evaluateMus({
      ...EXAMPLE,
      topStratum: [...MUS_EXAMPLE_TOP, { bookValue: 50000, auditedValue: 50250 }],
      factors: "table",
    });
    expect(withTop.overstatement.upperLimit - without.overstatement.upperLimit).toBeCloseTo(1500, 6);
    expect(withTop.understatement.upperLimit - without.understatement.upperLimit).toBeCloseTo(250, 6);
    expect(withTop.understatement.topStratumMisstatement).toBe(250);
  });

  it("bounds understatements alone with the same factors", () => {
    // One understatement of tainting 0.15: 65,760 + 3,288 + 0.75 × 0.15 × 21,920 = 71,514 (as in example A).
    const r = evaluateMus({
      interval: 21920,
      confidence: 0.95,
      sample: [{ bookValue: 2000, auditedValue: 2300 }],
      factors: "table",
    });
    expect(r.understatement.upperLimit).toBeCloseTo(71514, 2);
    expect(r.overstatement.upperLimit).toBeCloseTo(65760, 2);
    expect(r.mostLikelyMisstatement).toBeCloseTo(-3288, 2);
  });

  it("keeps a tainting above 1 uncapped and warns", () => {
    // Audited −500 on book 1,000: t = 1.5 (a credit where a debit was booked). Bound assumption 0 <= t <= 1 (Stringer).
    const r = evaluateMus({
      interval: 10000,
      confidence: 0.95,
      sample: [{ bookValue: 1000, auditedValue: -500 }],
      factors: "table",
    });
    expect(r.overstatement.taintings).toEqual([1.5]);
    expect(r.overstatement.projected).toBeCloseTo(15000, 6);
    expect(r.warnings.join(" ")).toMatch(/tainting of 1\.5000 \(above 1\)/);
  });

  it("warns when a sampled item belongs in the top stratum", () => {
    const r = evaluateMus({ interval: 1000, confidence: 0.95, sample: [{ bookValue: 1500, auditedValue: 1500 }] });
    expect(r.warnings.join(" ")).toMatch(/top stratum/);
  });

  it("property: the bound does not depend on the order of the sample", () => {
    const item = fc
      .record({
        bookValue: fc.integer({ min: 1, max: 2000000 }).map((c) => c / 100),
        share: fc.integer({ min: -50, max: 100 }),
      })
      .map(({ bookValue, share }) => ({ bookValue, auditedValue: Math.round(bookValue * (100 - share)) / 100 }));
    fc.assert(
      fc.property(fc.array(item, { maxLength: 25 }), (sample) => {
        const reversed = [...sample].reverse();
        const a = evaluateMus({ interval: 25000, confidence: 0.9, sample });
        const b = evaluateMus({ interval: 25000, confidence: 0.9, sample: reversed });
        expect(b.overstatement.upperLimit).toBeCloseTo(a.overstatement.upperLimit, 6);
        expect(b.understatement.upperLimit).toBeCloseTo(a.understatement.upperLimit, 6);
      }),
      { numRuns: 100 },
    );
  });

  describe("rejects bad input", () => {
    it("a sampled item with book value 0, naming it", () =>
      expect(() =>
        evaluateMus({
          interval: 1000,
          confidence: 0.95,
          sample: [
            { bookValue: 10, auditedValue: 10 },
            { bookValue: 0, auditedValue: 5 },
          ],
        }),
      ).toThrow(/sample\[1\]\.bookValue must be greater than zero/));
    it("an audited value with 3 decimals", () =>
      expect(() =>
        evaluateMus({ interval: 1000, confidence: 0.95, sample: [{ bookValue: 10, auditedValue: 9.999 }] }),
      ).toThrow(/sample\[0\]\.auditedValue must have at most 2 decimals/));
    it("a zero interval", () =>
      expect(() => evaluateMus({ interval: 0, confidence: 0.95, sample: [] })).toThrow(
        /interval must be greater than zero/,
      ));
    it("confidence 95 instead of 0.95", () =>
      expect(() => evaluateMus({ interval: 10, confidence: 95, sample: [] })).toThrow(
        /confidence must be strictly between 0 and 1/,
      ));
    it("an unknown factors mode", () =>
      expect(() => evaluateMus({ interval: 10, confidence: 0.95, sample: [], factors: "binomial" as "exact" })).toThrow(
        /factors must be one of/,
      ));
    it("a sample that is not an array", () =>
      expect(() => evaluateMus({ interval: 10, confidence: 0.95, sample: {} as never })).toThrow(TypeError));
    it("a top-stratum item missing its audited value", () =>
      expect(() =>
        evaluateMus({ interval: 10, confidence: 0.95, sample: [], topStratum: [{ bookValue: 50 } as never] }),
      ).toThrow(/topStratum\[0\]\.auditedValue must be a number/));
  });
});

describe("evaluateMus below 63 % confidence (issue 13 §3)", () => {
  it("refuses, naming confidence and saying why", () => {
    // scipy.stats.gamma.ppf: at 0.62, RF(0) = 0.9676 < 1; at 0.50, RF(1) − RF(0) = 0.9852 < 1.
    expect(() => evaluateMus({ interval: 1000, confidence: 0.62, sample: [] })).toThrow(
      /^confidence must be at least 63%.*RF\(0\) drops under 1/,
    );
    expect(() => evaluateMus({ interval: 1000, confidence: 0.63, sample: [] })).not.toThrow();
  });
});
