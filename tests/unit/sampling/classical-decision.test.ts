import { describe, expect, it } from "vitest";
import { classicalDecision, createRng, variablesSampleSize } from "@/lib/sampling";
import { normalQuantile } from "@/lib/sampling/quantiles";

describe("classicalDecision", () => {
  // Issue 13 worked example (difference estimator, N 2,400, n 40, TM 100,000, RIA 5 %, RIR 10 %, both
  // directions); the rule is the AICPA Audit Guide "Audit Sampling" classical variables decision:
  // A′ = z_α·SE, A″ = A′ + TM·(1 − A′/A) when A′ > A. SE is quoted rounded to cents, hence 1-decimal tolerance.
  const example = {
    bookValue: 4006960.42,
    estimatedAuditedValue: 4006960.42 - 35907.6,
    standardError: 35607.11,
    tolerableMisstatement: 100000,
    plannedAllowance: 50000,
    riskOfIncorrectRejection: 0.1,
    direction: "both" as const,
  };

  it("supports the worked example under the adjusted allowance", () => {
    const d = classicalDecision(example);
    expect(d.coefficient).toBeCloseTo(1.644854, 6); // scipy.stats.norm.ppf(0.95) = 1.6448536269514722
    expect(d.achievedAllowance).toBeCloseTo(58568.49, 1);
    expect(d.adjustedAllowance).toBeCloseTo(41431.51, 1);
    expect(d.allowance).toBe(d.adjustedAllowance);
    expect(d.supported).toBe(true);
    expect(d.beyondLimit).toBe(0);
    expect(d.lowerLimit).toBeCloseTo(example.estimatedAuditedValue - 41431.51, 1);
  });

  it("equals the 'projected misstatement + z_β·SE ≤ TM' form when A′ > A (EM = 0)", () => {
    const d = classicalDecision(example);
    const zBeta = normalQuantile(0.95);
    expect(example.tolerableMisstatement - zBeta * example.standardError).toBeCloseTo(d.adjustedAllowance!, 6);
  });

  it("uses Ŷ ± A′ when A′ ≤ A, and states how far BV lies beyond the nearest limit", () => {
    const d = classicalDecision({ ...example, standardError: 20000, estimatedAuditedValue: example.bookValue - 40000 });
    expect(d.adjustedAllowance).toBeNull();
    expect(d.allowance).toBeCloseTo(1.6448536269514722 * 20000, 6);
    expect(d.supported).toBe(false);
    expect(d.beyond).toBe("upper");
    expect(d.beyondLimit).toBeCloseTo(40000 - 1.6448536269514722 * 20000, 6);
  });

  it("tests one side only, with a one-sided z_α", () => {
    const over = classicalDecision({
      ...example,
      direction: "overstatement",
      standardError: 10000,
      estimatedAuditedValue: example.bookValue + 1e6,
    });
    expect(over.coefficient).toBeCloseTo(1.281552, 6); // scipy.stats.norm.ppf(0.90) = 1.2815515655446004
    expect(over.lowerLimit).toBe(-Infinity);
    expect(over.supported).toBe(true); // BV far below Ŷ: an understatement, not tested
    const under = classicalDecision({
      ...example,
      direction: "understatement",
      standardError: 10000,
      estimatedAuditedValue: example.bookValue + 1e6,
    });
    expect(under.supported).toBe(false);
    expect(under.beyond).toBe("lower");
  });

  it("uses Student's t with the given degrees of freedom", () => {
    const d = classicalDecision({ ...example, distribution: "t", degreesOfFreedom: 39 });
    expect(d.coefficient).toBeCloseTo(1.6848751217112248, 6); // scipy.stats.t.ppf(0.95, 39)
  });

  it("names the field for bad input", () => {
    expect(() => classicalDecision({ ...example, plannedAllowance: 0 })).toThrow(/plannedAllowance/);
    expect(() => classicalDecision({ ...example, direction: "sideways" as "both" })).toThrow(/direction/);
    expect(() => classicalDecision({ ...example, distribution: "t" })).toThrow(/degreesOfFreedom/);
    expect(() => classicalDecision({ ...example, standardError: -1 })).toThrow(/standardError/);
  });
});

/**
 * Regression test (issue 13): with the sample's SE equal to the planned one (SE = A / z_α), the
 * achieved risks of incorrect rejection (true misstatement 0) and of incorrect acceptance (true
 * misstatement = TM in the direction tested) must be the planned ones, within ±1 point. Seeded:
 * MT19937 uniforms through the normal quantile (inverse transform).
 */
describe("achieved risks of the decision rule (seeded simulation)", () => {
  const TM = 100000,
    RIA = 0.05,
    RIR = 0.1,
    BV = 5_000_000,
    TRIALS = 40000;
  for (const direction of ["overstatement", "understatement", "both"] as const) {
    it(`keeps RIR ${RIR} and RIA ${RIA} within ±1 point for ${direction}`, () => {
      const sides = direction === "both" ? "two" : "one";
      const zAlpha = normalQuantile(sides === "two" ? 1 - RIR / 2 : 1 - RIR);
      const zBeta = normalQuantile(1 - RIA);
      const A = (TM * zAlpha) / (zAlpha + zBeta);
      // The planning form sizes so that z_α·SE = A: check that variablesSampleSize uses the same sides.
      const sized = variablesSampleSize({
        populationSize: 1e6,
        estimatedStdDev: 100,
        tolerableMisstatement: TM,
        riskOfIncorrectAcceptance: RIA,
        riskOfIncorrectRejection: RIR,
        sides,
      });
      expect(sized.plannedAllowance).toBeCloseTo(A, 6);
      const SE = A / zAlpha;
      const rng = createRng(20261203);
      const normal = () => normalQuantile(Math.min(1 - 2 ** -53, Math.max(2 ** -53, rng.nextDouble())));
      const sign = direction === "understatement" ? -1 : 1; // misstatement direction tested (for "both": overstatement)
      let rejections = 0,
        acceptances = 0;
      for (let i = 0; i < TRIALS; i++) {
        const correct = classicalDecision({
          bookValue: BV,
          estimatedAuditedValue: BV + SE * normal(),
          standardError: SE,
          tolerableMisstatement: TM,
          plannedAllowance: A,
          riskOfIncorrectRejection: RIR,
          direction,
        });
        if (!correct.supported) rejections++;
        const misstated = classicalDecision({
          bookValue: BV,
          estimatedAuditedValue: BV - sign * TM + SE * normal(),
          standardError: SE,
          tolerableMisstatement: TM,
          plannedAllowance: A,
          riskOfIncorrectRejection: RIR,
          direction,
        });
        if (misstated.supported) acceptances++;
      }
      expect(Math.abs(rejections / TRIALS - RIR)).toBeLessThan(0.01);
      expect(Math.abs(acceptances / TRIALS - RIA)).toBeLessThan(0.01);
    });
  }
});
