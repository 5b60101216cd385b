import { describe, expect, it } from "vitest";
import betaQuantile from "@stdlib/stats-base-dists-beta-quantile";
import hypergeometricCdf from "@stdlib/stats-base-dists-hypergeometric-cdf";
import { buildAttributesEvaluation } from "@/lib/samples/evaluation-blocks";

const common = { confidence: 0.95, tolerableRate: 0.2, expectedRate: 0, allowedDeviations: 0 };

describe("attribute evaluation block: small populations and control-frequency plans", () => {
  it("gives the exact hypergeometric limit M_U / N for a plan sized on its population", () => {
    const b = buildAttributesEvaluation({ ...common, sampleSize: 10, deviations: 1, populationSize: 20 });
    // scipy.stats.hypergeom.cdf(1, 20, 6, 10) = 0.0704 > 0.05 and hypergeom.cdf(1, 20, 7, 10) = 0.0286 → M_U 6.
    // @stdlib hypergeometric-cdf(x, N, K, n) gives the same two values:
    expect(hypergeometricCdf(1, 20, 6, 10)).toBeCloseTo(0.0704, 4);
    expect(hypergeometricCdf(1, 20, 7, 10)).toBeCloseTo(0.0286, 4);
    expect(b).toMatchObject({
      model: "hypergeometric",
      populationSize: 20,
      upperDeviations: 6,
      controlFrequency: null,
      supported: false,
    });
    expect(b.upperDeviationLimit).toBeCloseTo(0.3, 12);
    expect(b.formulaReferences.join(" ")).toMatch(/hypergeometric/i);
  });

  it("keeps the binomial Clopper–Pearson limit without a population size", () => {
    const b = buildAttributesEvaluation({ ...common, sampleSize: 14, deviations: 1 });
    // Clopper & Pearson (1934): Beta⁻¹(0.95; k + 1, n − k), @stdlib beta quantile.
    expect(b).toMatchObject({ model: "binomial", populationSize: null, upperDeviations: null });
    expect(b.upperDeviationLimit).toBeCloseTo(betaQuantile(0.95, 2, 13), 12);
  });

  it("judges a control-frequency plan on no deviation, with the limit for information only", () => {
    const row = { frequency: "Daily", minimumSampleSize: 25 };
    const clean = buildAttributesEvaluation({
      ...common,
      tolerableRate: 0,
      sampleSize: 25,
      deviations: 0,
      controlFrequency: row,
    });
    // k = 0: Beta⁻¹(0.95; 1, 25) = 1 − 0.05^(1/25) = 0.1129 (closed form; @stdlib beta quantile).
    expect(clean.upperDeviationLimit).toBeCloseTo(betaQuantile(0.95, 1, 25), 12);
    expect(clean.upperDeviationLimit).toBeCloseTo(1 - 0.05 ** (1 / 25), 12);
    expect(clean).toMatchObject({ supported: true, controlFrequency: row, model: "binomial" });
    expect(clean.statement).toMatch(/No deviation in 25 occurrences tested .* Daily → 25/);
    expect(clean.warnings.join(" ")).toMatch(/for information only/);
    const one = buildAttributesEvaluation({
      ...common,
      tolerableRate: 0,
      sampleSize: 25,
      deviations: 1,
      controlFrequency: row,
    });
    expect(one.supported).toBe(false);
    expect(one.statement).toMatch(/expects none/);
  });
});
