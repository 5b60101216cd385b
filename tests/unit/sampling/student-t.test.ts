import { describe, expect, it } from "vitest";
import { evaluateStratified, evaluateVariables, studentQuantile } from "@/lib/sampling";
import { STRATUM_A, STRATUM_B, UNSTRATIFIED } from "./fixtures";

describe("Student t option (issue 13 §5)", () => {
  it.each([
    [0.975, 39, 2.022690920036761],
    [0.95, 39, 1.6848751217112248],
    [0.95, 9, 1.833112932656237],
    [0.9, 38, 1.3042302038905027],
  ])("studentQuantile(%s, %s) = scipy.stats.t.ppf → %s", (p, df, expected) => {
    expect(studentQuantile(p, df)).toBeCloseTo(expected, 6); // jStat inverts the incomplete beta to about 2e-8
  });

  it("uses n − 1 degrees of freedom (regression n − 2)", () => {
    const base = { ...UNSTRATIFIED, confidence: 0.95, sides: "two" as const, distribution: "t" as const };
    const mpu = evaluateVariables({ ...base, estimator: "mean-per-unit" });
    expect(mpu.degreesOfFreedom).toBe(29);
    expect(mpu.zValue).toBeCloseTo(2.045229642132703, 6); // scipy.stats.t.ppf(0.975, 29)
    const reg = evaluateVariables({ ...base, estimator: "regression" });
    expect(reg.degreesOfFreedom).toBe(28);
    expect(reg.zValue).toBeCloseTo(2.0484071417952454, 6); // scipy.stats.t.ppf(0.975, 28)
    expect(evaluateVariables({ ...base, distribution: "z", estimator: "mean-per-unit" }).zValue).toBeCloseTo(
      1.959963984540054,
      10,
    );
  });

  it("uses Satterthwaite's degrees of freedom for strata, and warns on n < 30 and on each stratum with n_h < 10", () => {
    // numpy/scipy: v_h = N_h²(1 − f_h)s_h²/n_h; ν = (Σv_h)²/Σ(v_h²/(n_h − 1)) = 13.693375252431373; t.ppf(0.975, ν) = 2.14930112374242
    const r = evaluateStratified({
      strata: [STRATUM_A, STRATUM_B],
      confidence: 0.95,
      sides: "two",
      estimator: "mean-per-unit",
      distribution: "t",
    });
    expect(r.degreesOfFreedom).toBeCloseTo(13.693375252431373, 8);
    expect(r.zValue).toBeCloseTo(2.14930112374242, 7);
    expect(r.warnings.join(" ")).toMatch(/Only 20 items in the sample: below 30/);
    expect(r.warnings.join(" ")).toMatch(/Stratum 1 has only 8 sampled items/);
    expect(r.warnings.join(" ")).not.toMatch(/Stratum 2 has only/);
  });

  it("names the field for an unknown distribution", () => {
    expect(() =>
      evaluateVariables({
        ...UNSTRATIFIED,
        confidence: 0.95,
        sides: "two",
        estimator: "difference",
        distribution: "w" as "z",
      }),
    ).toThrow(/^distribution/);
  });
});
