import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { evaluateVariables, type Estimator } from "@/lib/sampling";
import { BIGCITY, UNSTRATIFIED } from "./fixtures";

const base = { ...UNSTRATIFIED, confidence: 0.95, sides: "two" as const };

describe("evaluateVariables on the R survey reference sample (N 500, X 1,180,000, n 30)", () => {
  it("mean-per-unit", () => {
    // R 4.2.2 survey 4.1.1: svytotal(~audit, des) → 1169416.7, SE 114139.99; manual N*sqrt((1-f)/n)*sd(audit)
    // = 114139.986542; z-CI [945706.4038, 1393126.9295]
    const r = evaluateVariables({ ...base, estimator: "mean-per-unit" });
    expect(r.estimatedAuditedValue).toBeCloseTo(1169416.6667, 3);
    expect(r.standardError).toBeCloseTo(114139.986542, 5);
    expect(r.lowerBound).toBeCloseTo(945706.4038, 3);
    expect(r.upperBound).toBeCloseTo(1393126.9295, 3);
    expect(r.projectedMisstatement).toBeCloseTo(1180000 - 1169416.6667, 3);
  });

  it("difference", () => {
    // R: X + coef(svytotal(~d, des)) = 1153333.333333, SE(svytotal(~d)) = 12162.769018; z-CI [1129494.7441, 1177171.9226]
    const r = evaluateVariables({ ...base, estimator: "difference" });
    expect(r.estimatedAuditedValue).toBeCloseTo(1153333.333333, 5);
    expect(r.standardError).toBeCloseTo(12162.769018, 5);
    expect(r.lowerBound).toBeCloseTo(1129494.7441, 3);
    expect(r.upperBound).toBeCloseTo(1177171.9226, 3);
    expect(r.misstatementsInSample).toBe(7);
  });

  it("ratio (Cochran eq. 6.9, N form)", () => {
    // R: predict(svyratio(~audit, ~book, des), total = X)$total = 1153691.911099; the N form
    // N*sqrt((1-f)/n)*sqrt(s2e) = 12626.007835 (survey's own SE, 12456.23012, is the x̄ form).
    const r = evaluateVariables({ ...base, estimator: "ratio" });
    expect(r.estimatedAuditedValue).toBeCloseTo(1153691.911099, 5);
    expect(r.standardError).toBeCloseTo(12626.007835, 5);
    expect(r.projectedMisstatement).toBeCloseTo(26308.088901, 5);
  });

  it("regression (Cochran ch. 7, residual divisor n − 2)", () => {
    // R: b = coef(lm(audit ~ book, s))[2] = 1.0092153397; N*(ybar + b*(Xbar - xbar)) = 1153185.119953 (equal
    // to svytotal(~audit, calibrate(...)) = 1153185.1); SE with (n-2) = 12333.041198.
    const r = evaluateVariables({ ...base, estimator: "regression" });
    expect(r.estimatedAuditedValue).toBeCloseTo(1153185.119953, 5);
    expect(r.standardError).toBeCloseTo(12333.041198, 5);
  });

  it("one-sided bounds use z at c and leave the other side infinite", () => {
    // z(0.95) = 1.6448536270 (R qnorm(0.95)); difference SE 12162.769018 as above.
    const upper = evaluateVariables({ ...base, estimator: "difference", sides: "upper" });
    expect(upper.allowance).toBeCloseTo(1.644853627 * 12162.769018, 3);
    expect(upper.lowerBound).toBe(-Infinity);
    const lower = evaluateVariables({ ...base, estimator: "difference", sides: "lower" });
    expect(lower.upperBound).toBe(Infinity);
    expect(lower.lowerBound).toBeCloseTo(1153333.333333 - 1.644853627 * 12162.769018, 3);
  });

  it("warns when there are fewer than about 20 misstatements (common practice)", () => {
    for (const estimator of ["difference", "ratio", "regression"] as const) {
      expect(evaluateVariables({ ...base, estimator }).warnings.join(" ")).toMatch(/Only 7 misstatements/);
    }
    expect(evaluateVariables({ ...base, estimator: "mean-per-unit" }).warnings).toEqual([]);
  });
});

describe("evaluateVariables on Cochran's 49 cities (R boot::bigcity)", () => {
  it("ratio estimate of the 1930 total with X = 22,919 (N = 196)", () => {
    // R 4.2.2 boot 1.3-28.1: R*X = 28397.0673; N*sqrt((1-f)/n)*s_e = 604.0362 (N form); MPU N*ybar = 25048,
    // SE 2985.5307. X = 22,919 for all 196 cities is from memory (Cochran 1977 ch. 6); 28,397 matches Cochran's figure.
    const input = {
      populationSize: 196,
      populationBookValue: 22919,
      sample: BIGCITY,
      confidence: 0.95,
      sides: "two" as const,
    };
    const ratio = evaluateVariables({ ...input, estimator: "ratio" });
    expect(ratio.estimatedAuditedValue).toBeCloseTo(28397.0673, 3);
    expect(ratio.standardError).toBeCloseTo(604.0362, 3);
    const mpu = evaluateVariables({ ...input, estimator: "mean-per-unit" });
    expect(mpu.estimatedAuditedValue).toBeCloseTo(25048, 6);
    expect(mpu.standardError).toBeCloseTo(2985.5307, 3);
  });
});

describe("evaluateVariables properties", () => {
  const item = fc
    .record({ bookValue: fc.integer({ min: 100, max: 10000000 }), diff: fc.integer({ min: -20000, max: 20000 }) })
    .map(({ bookValue, diff }) => ({ bookValue: bookValue / 100, auditedValue: (bookValue + diff) / 100 }));
  it("estimates do not depend on the order of the sample", () => {
    fc.assert(
      fc.property(
        fc.array(item, { minLength: 3, maxLength: 40 }),
        fc.constantFrom<Estimator>("mean-per-unit", "difference", "ratio", "regression"),
        (sample, estimator) => {
          fc.pre(new Set(sample.map((s) => s.bookValue)).size > 1);
          const input = {
            estimator,
            populationSize: 1000,
            populationBookValue: 1e6,
            confidence: 0.9,
            sides: "two" as const,
          };
          const a = evaluateVariables({ ...input, sample });
          const b = evaluateVariables({ ...input, sample: [...sample].reverse() });
          expect(b.estimatedAuditedValue).toBeCloseTo(a.estimatedAuditedValue, 4);
          expect(b.standardError).toBeCloseTo(a.standardError, 4);
        },
      ),
      { numRuns: 150 },
    );
  });
  it("a sample with no misstatement gives the book value and zero SE for difference and ratio", () => {
    const sample = [
      { bookValue: 10, auditedValue: 10 },
      { bookValue: 25.5, auditedValue: 25.5 },
      { bookValue: 7, auditedValue: 7 },
    ];
    for (const estimator of ["difference", "ratio"] as const) {
      const r = evaluateVariables({
        estimator,
        populationSize: 100,
        populationBookValue: 1234.56,
        sample,
        confidence: 0.95,
        sides: "two",
      });
      expect(r.estimatedAuditedValue).toBeCloseTo(1234.56, 8);
      expect(r.standardError).toBeCloseTo(0, 8);
    }
  });
  it("the finite population correction zeroes the variance of a census", () => {
    const sample = [
      { bookValue: 10, auditedValue: 9 },
      { bookValue: 20, auditedValue: 20 },
    ];
    const r = evaluateVariables({
      estimator: "mean-per-unit",
      populationSize: 2,
      populationBookValue: 30,
      sample,
      confidence: 0.95,
      sides: "two",
    });
    expect(r.estimatedAuditedValue).toBe(29);
    expect(r.standardError).toBe(0);
  });
});

describe("evaluateVariables rejects bad input", () => {
  it("an unknown estimator", () =>
    expect(() => evaluateVariables({ ...base, estimator: "median" as Estimator })).toThrow(/estimator must be one of/));
  it("a sample larger than the population", () =>
    expect(() => evaluateVariables({ ...base, estimator: "difference", populationSize: 20 })).toThrow(
      /sample must hold at least 2 and at most 20 items/,
    ));
  it("a single-item sample", () =>
    expect(() => evaluateVariables({ ...base, estimator: "difference", sample: [base.sample[0]] })).toThrow(
      /sample must hold at least 2/,
    ));
  it("two items for regression", () =>
    expect(() => evaluateVariables({ ...base, estimator: "regression", sample: base.sample.slice(0, 2) })).toThrow(
      /at least 3/,
    ));
  it("a zero sample book total for the ratio estimator", () =>
    expect(() =>
      evaluateVariables({
        ...base,
        estimator: "ratio",
        sample: [
          { bookValue: 10, auditedValue: 5 },
          { bookValue: -10, auditedValue: 0 },
        ],
      }),
    ).toThrow(/must not be zero for the ratio estimator/));
  it("constant book values for regression", () =>
    expect(() =>
      evaluateVariables({
        ...base,
        estimator: "regression",
        sample: [1, 2, 3].map((a) => ({ bookValue: 10, auditedValue: a })),
      }),
    ).toThrow(/must vary for the regression estimator/));
  it("an item with a non-numeric audited value, naming it", () =>
    expect(() =>
      evaluateVariables({
        ...base,
        estimator: "difference",
        sample: [base.sample[0], { bookValue: 1, auditedValue: "n/a" as unknown as number }],
      }),
    ).toThrow(/sample\[1\]\.auditedValue must be a number/));
  it("a population book value with 3 decimals", () =>
    expect(() => evaluateVariables({ ...base, estimator: "difference", populationBookValue: 1.005 })).toThrow(
      /populationBookValue must have at most 2 decimals/,
    ));
  it("an unknown sides value", () =>
    expect(() => evaluateVariables({ ...base, estimator: "difference", sides: "both" as "two" })).toThrow(
      /sides must be one of/,
    ));
  it("confidence 1", () =>
    expect(() => evaluateVariables({ ...base, estimator: "difference", confidence: 1 })).toThrow(/confidence/));
});
