import { describe, expect, it } from "vitest";
import stdlibBinomialCdf from "@stdlib/stats-base-dists-binomial-cdf";
import { evaluateTwoStageAttributes, twoStageAttributePlan, twoStageRisk } from "@/lib/sampling";

/** b(0; n) + b(1; n)·(1 − p)^n₂ from @stdlib's binomial CDF: b(0) = F(0), b(1) = F(1) − F(0). */
const stdlibRisk = (n1: number, n2: number, p: number) => {
  const f0 = stdlibBinomialCdf(0, n1, p);
  return f0 + (stdlibBinomialCdf(1, n1, p) - f0) * (1 - p) ** n2;
};

describe("twoStageAttributePlan", () => {
  // Plans searched independently with scipy 1.17 (scipy.stats.binom.pmf, the rule of issue 13).
  it.each([
    [0.05, 0, 0.95, 59, 90, 0.049983596911170394, 59],
    [0.05, 0.01, 0.95, 65, 42, 0.04979236455930694, 79.34878410944785],
    [0.1, 0.02, 0.9, 25, 19, 0.09872795792994979, 30.84991319683625],
  ])(
    "TDR %s, EDR %s, confidence %s → n₁ %s, n₂ %s (scipy)",
    (tolerableRate, expectedRate, confidence, n1, n2, risk, expected) => {
      const plan = twoStageAttributePlan({ tolerableRate, expectedRate, confidence });
      expect(plan.firstStageSize).toBe(n1);
      expect(plan.secondStageSize).toBe(n2);
      expect(plan.riskOfOverreliance).toBeCloseTo(risk, 10);
      expect(plan.expectedSampleSize).toBeCloseTo(expected, 8);
      expect(plan.riskOfOverreliance).toBeCloseTo(stdlibRisk(n1, n2, tolerableRate), 10);
    },
  );

  it("takes the smallest n₂ for a given first stage (scipy: n₁ 70 → n₂ 30, risk 0.049396166511689835)", () => {
    const plan = twoStageAttributePlan({
      tolerableRate: 0.05,
      expectedRate: 0.01,
      confidence: 0.95,
      firstStageSize: 70,
    });
    expect(plan.secondStageSize).toBe(30);
    expect(plan.riskOfOverreliance).toBeCloseTo(0.049396166511689835, 10);
    expect(stdlibRisk(70, 29, 0.05)).toBeGreaterThan(0.05);
  });

  it("shows why an unplanned extension is not a plan: 59 then 34 more after one deviation carries ≈ 7.5 % risk (scipy 0.07482106024330157)", () => {
    expect(twoStageRisk(59, 34, 0.05)).toBeCloseTo(0.07482106024330157, 10);
    expect(stdlibRisk(59, 34, 0.05)).toBeCloseTo(0.07482106024330157, 10);
  });

  it("refuses a first stage too small for any second stage, naming the field", () => {
    expect(() =>
      twoStageAttributePlan({ tolerableRate: 0.05, expectedRate: 0, confidence: 0.95, firstStageSize: 58 }),
    ).toThrow(/^firstStageSize/);
    expect(() => twoStageAttributePlan({ tolerableRate: 0.05, expectedRate: 0.06, confidence: 0.95 })).toThrow(
      /^expectedRate/,
    );
  });
});

describe("evaluateTwoStageAttributes", () => {
  const plan = twoStageAttributePlan({ tolerableRate: 0.05, expectedRate: 0, confidence: 0.95 });
  it("accepts on 0, rejects on 2+, continues on exactly 1 (issue 13 rule)", () => {
    expect(evaluateTwoStageAttributes({ plan, firstStageDeviations: 0 })).toEqual({
      stage: 1,
      decision: "accept",
      riskOfOverreliance: plan.riskOfOverreliance,
    });
    expect(evaluateTwoStageAttributes({ plan, firstStageDeviations: 2 }).decision).toBe("reject");
    expect(evaluateTwoStageAttributes({ plan, firstStageDeviations: 1 })).toMatchObject({
      stage: 1,
      decision: "continue",
    });
    expect(evaluateTwoStageAttributes({ plan, firstStageDeviations: 1, secondStageDeviations: 0 })).toMatchObject({
      stage: 2,
      decision: "accept",
    });
    expect(evaluateTwoStageAttributes({ plan, firstStageDeviations: 1, secondStageDeviations: 1 })).toMatchObject({
      stage: 2,
      decision: "reject",
    });
  });
  it("names the field for bad input", () => {
    expect(() => evaluateTwoStageAttributes({ plan, firstStageDeviations: 0, secondStageDeviations: 0 })).toThrow(
      /^secondStageDeviations/,
    );
    expect(() => evaluateTwoStageAttributes({ plan, firstStageDeviations: -1 })).toThrow(/^firstStageDeviations/);
  });
});
