import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { evaluateStratified, evaluateVariables, type StratifiedEstimator } from "@/lib/sampling";
import { STRATUM_A, STRATUM_B } from "./fixtures";

const base = { strata: [STRATUM_A, STRATUM_B], confidence: 0.95, sides: "two" as const };

describe("evaluateStratified on the R survey stratified sample (N_A 60, N_B 440)", () => {
  it("stratified mean-per-unit", () => {
    // R 4.2.2 survey 4.1.1: svytotal(~audit, sdes) → 1126583.3, SE 70072.198
    const r = evaluateStratified({ ...base, estimator: "mean-per-unit" });
    expect(r.estimatedAuditedValue).toBeCloseTo(1126583.3333, 3);
    expect(r.standardError).toBeCloseTo(70072.198, 3);
  });
  it("stratified difference", () => {
    // R: sum(Xh) + coef(svytotal(~d, sdes)) = 1129250.0000, SE 36170.9154
    const r = evaluateStratified({ ...base, estimator: "difference" });
    expect(r.estimatedAuditedValue).toBeCloseTo(1129250, 4);
    expect(r.standardError).toBeCloseTo(36170.9154, 3);
  });
  it("separate ratio (N form per stratum)", () => {
    // R: predict(svyratio(~audit, ~book, sdes, separate=TRUE), total=Xh) → 1128894.229; manual N-form SE
    // sqrt(sum(var_N)) = 37357.4452; per stratum R̂_A·X_A = 533287.2928, R̂_B·X_B = 595606.9364.
    const r = evaluateStratified({ ...base, estimator: "separate-ratio" });
    expect(r.estimatedAuditedValue).toBeCloseTo(1128894.2292, 3);
    expect(r.standardError).toBeCloseTo(37357.4452, 3);
    expect(r.strata[0].estimatedAuditedValue).toBeCloseTo(533287.2928, 3);
    expect(r.strata[1].estimatedAuditedValue).toBeCloseTo(595606.9364, 3);
    expect(r.warnings.join(" ")).toMatch(/stratum 1, 2 have fewer than 20 sampled items/);
  });
  it("combined ratio (plain sum of within-stratum variances)", () => {
    // R: predict(svyratio(~audit, ~book, sdes), total=sum(Xh)) → 1129135.051; manual plain sqrt(v) = 36885.9650
    // (survey's 36969.51196 multiplies by X/X̂_st); R̂_c = 0.9568941110.
    const r = evaluateStratified({ ...base, estimator: "combined-ratio" });
    expect(r.estimatedAuditedValue).toBeCloseTo(1129135.051, 3);
    expect(r.standardError).toBeCloseTo(36885.965, 3);
    expect(r.estimatedAuditedValue / 1180000).toBeCloseTo(0.956894111, 9);
  });
  it("reports the projected misstatement against the summed stratum book values", () => {
    const r = evaluateStratified({ ...base, estimator: "difference" });
    expect(r.projectedMisstatement).toBeCloseTo(1180000 - 1129250, 4);
  });
});

describe("evaluateStratified properties", () => {
  const item = fc
    .record({ bookValue: fc.integer({ min: 100, max: 5000000 }), diff: fc.integer({ min: -10000, max: 10000 }) })
    .map(({ bookValue, diff }) => ({ bookValue: bookValue / 100, auditedValue: (bookValue + diff) / 100 }));
  const pairs: [StratifiedEstimator, "mean-per-unit" | "difference" | "ratio"][] = [
    ["mean-per-unit", "mean-per-unit"],
    ["difference", "difference"],
    ["separate-ratio", "ratio"],
    ["combined-ratio", "ratio"],
  ];
  it("one stratum equals the unstratified evaluation", () => {
    fc.assert(
      fc.property(
        fc.array(item, { minLength: 2, maxLength: 40 }),
        fc.constantFrom(...pairs),
        (sample, [stratified, plain]) => {
          const stratum = { populationSize: 500, populationBookValue: 250000, sample };
          const a = evaluateStratified({ estimator: stratified, strata: [stratum], confidence: 0.9, sides: "two" });
          const b = evaluateVariables({ estimator: plain, ...stratum, confidence: 0.9, sides: "two" });
          expect(a.estimatedAuditedValue).toBeCloseTo(b.estimatedAuditedValue, 5);
          expect(a.standardError).toBeCloseTo(b.standardError, 5);
        },
      ),
      { numRuns: 150 },
    );
  });
});

describe("evaluateStratified rejects bad input", () => {
  it("an unknown estimator", () =>
    expect(() => evaluateStratified({ ...base, estimator: "ratio" as StratifiedEstimator })).toThrow(
      /estimator must be one of/,
    ));
  it("an empty strata list", () =>
    expect(() => evaluateStratified({ ...base, strata: [], estimator: "difference" })).toThrow(/strata must contain/));
  it("a stratum with one sampled item, naming the stratum", () =>
    expect(() =>
      evaluateStratified({
        ...base,
        strata: [STRATUM_A, { ...STRATUM_B, sample: STRATUM_B.sample.slice(0, 1) }],
        estimator: "difference",
      }),
    ).toThrow(/strata\[1\]\.sample must hold at least 2/));
  it("a stratum whose sample exceeds its population", () =>
    expect(() =>
      evaluateStratified({ ...base, strata: [{ ...STRATUM_A, populationSize: 5 }], estimator: "difference" }),
    ).toThrow(/strata\[0\]\.sample must hold at least 2 and at most 5/));
  it("a stratum book value with 3 decimals", () =>
    expect(() =>
      evaluateStratified({ ...base, strata: [{ ...STRATUM_A, populationBookValue: 1.234 }], estimator: "difference" }),
    ).toThrow(/strata\[0\]\.populationBookValue/));
  it("a zero stratum book total for the separate ratio", () =>
    expect(() =>
      evaluateStratified({
        ...base,
        strata: [
          {
            populationSize: 10,
            populationBookValue: 0,
            sample: [
              { bookValue: 5, auditedValue: 5 },
              { bookValue: -5, auditedValue: 0 },
            ],
          },
        ],
        estimator: "separate-ratio",
      }),
    ).toThrow(/strata\[0\]\.sample bookValue total must not be zero/));
});
