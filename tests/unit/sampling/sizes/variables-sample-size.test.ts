import { describe, expect, it } from "vitest";
import { variablesSampleSize } from "@/lib/sampling";

describe("variablesSampleSize (MPU, AICPA-style)", () => {
  it("N 2,000, S 120, TM 40,000, RIR 10% two-sided, RIA 5%: A 20,000, n' 389.5983, n 327", () => {
    // Python 3.11.7 / scipy 1.17.1 worked example: U_α = U_β = 1.644854, A = 40,000·U_α/(U_α+U_β) = 20,000,
    // n' = (1.644854 × 120 × 2000 / 20000)² = 389.5983, n = 389.5983/(1 + 389.5983/2000) = 326.08 → 327.
    const r = variablesSampleSize({
      populationSize: 2000,
      estimatedStdDev: 120,
      tolerableMisstatement: 40000,
      riskOfIncorrectAcceptance: 0.05,
      riskOfIncorrectRejection: 0.1,
    });
    expect(r.plannedAllowance).toBeCloseTo(20000, 4);
    expect(r.uncorrectedSampleSizeExact).toBeCloseTo(389.5983, 4);
    expect(r.uncorrectedSampleSize).toBe(390);
    expect(r.sampleSize).toBe(327);
  });

  it("subtracts the expected misstatement from TM in the planned allowance", () => {
    // A = (TM − EM)·z_a/(z_a + z_b) with z_a = z_b: (40,000 − 10,000)/2 = 15,000.
    const r = variablesSampleSize({
      populationSize: 2000,
      estimatedStdDev: 120,
      tolerableMisstatement: 40000,
      expectedMisstatement: 10000,
      riskOfIncorrectAcceptance: 0.05,
      riskOfIncorrectRejection: 0.1,
    });
    expect(r.plannedAllowance).toBeCloseTo(15000, 4);
  });

  it.each([
    // Ratio A/TM = z_(1−α/2)/(z_(1−α/2) + z_(1−β)) (Python/scipy, exact z): RIA 10%, RIR 5% → 0.6046; RIA 1%, RIR 20% → 0.3552
    [0.1, 0.05, 0.6046],
    [0.01, 0.2, 0.3552],
    [0.25, 0.01, 0.7925],
  ])("A/TM at RIA %f, RIR %f is %f", (ria, rir, ratio) => {
    const r = variablesSampleSize({
      populationSize: 1000,
      estimatedStdDev: 50,
      tolerableMisstatement: 10000,
      riskOfIncorrectAcceptance: ria,
      riskOfIncorrectRejection: rir,
    });
    expect(r.plannedAllowance / 10000).toBeCloseTo(ratio, 4);
  });

  it("never exceeds the population size", () => {
    const r = variablesSampleSize({
      populationSize: 50,
      estimatedStdDev: 1000,
      tolerableMisstatement: 100,
      riskOfIncorrectAcceptance: 0.05,
      riskOfIncorrectRejection: 0.1,
    });
    expect(r.sampleSize).toBe(50);
  });

  describe("rejects bad input", () => {
    const base = {
      populationSize: 2000,
      estimatedStdDev: 120,
      tolerableMisstatement: 40000,
      riskOfIncorrectAcceptance: 0.05,
      riskOfIncorrectRejection: 0.1,
    };
    it("EM at or above TM", () =>
      expect(() => variablesSampleSize({ ...base, expectedMisstatement: 40000 })).toThrow(
        /expectedMisstatement must be at least 0 and below tolerableMisstatement/,
      ));
    it("a zero standard deviation", () =>
      expect(() => variablesSampleSize({ ...base, estimatedStdDev: 0 })).toThrow(/estimatedStdDev/));
    it("a risk of 0", () =>
      expect(() => variablesSampleSize({ ...base, riskOfIncorrectAcceptance: 0 })).toThrow(
        /riskOfIncorrectAcceptance/,
      ));
    it("a risk of 1", () =>
      expect(() => variablesSampleSize({ ...base, riskOfIncorrectRejection: 1 })).toThrow(/riskOfIncorrectRejection/));
    it("a fractional population size", () =>
      expect(() => variablesSampleSize({ ...base, populationSize: 10.5 })).toThrow(/populationSize/));
  });
});
