import { describe, expect, it } from "vitest";
import { createRng, evaluateVariables, simulateEstimators, type SampledItem } from "@/lib/sampling";
import { drawSimpleRandomSample } from "@/lib/sampling/simulate";
import { correctedRatioEstimates } from "@/lib/sampling/ratio-corrected";

/** Deterministic populations built from a seeded MT19937 stream. */
function population(N: number, seed: number, make: (u: () => number) => [number, number]): SampledItem[] {
  const rng = createRng(seed);
  const u = () => rng.nextDouble();
  return Array.from({ length: N }, () => {
    const [book, audited] = make(u);
    return { bookValue: Math.round(book * 100) / 100, auditedValue: Math.round(audited * 100) / 100 };
  });
}

const SKEWED = population(3000, 11, (u) => {
  const book = 50 + 4000 * u() ** 3;
  return [book, u() < 0.15 ? book * (0.7 + 0.3 * u()) : book];
});

describe("simulateEstimators", () => {
  it("rmse² = bias² + sd² for every estimator", () => {
    const r = simulateEstimators({
      population: SKEWED,
      sampleSize: 60,
      trials: 2000,
      seed: 3,
      confidence: 0.95,
      estimators: ["mean-per-unit", "difference", "ratio", "regression"],
    });
    for (const s of Object.values(r)) expect(s.rmse ** 2).toBeCloseTo(s.bias ** 2 + s.standardDeviation ** 2, 0);
    for (const s of Object.values(r)) expect(s.rmse / Math.hypot(s.bias, s.standardDeviation)).toBeCloseTo(1, 12);
  });

  it("is deterministic for a seed and changes with the seed", () => {
    const run = (seed: number) =>
      simulateEstimators({
        population: SKEWED,
        sampleSize: 30,
        trials: 300,
        seed,
        confidence: 0.9,
        estimators: ["ratio"],
      });
    expect(run(5)).toEqual(run(5));
    expect(run(6).ratio.meanEstimate).not.toBe(run(5).ratio.meanEstimate);
  });

  it("one trial reproduces evaluateVariables on the same drawn sample", () => {
    const rng = createRng(42);
    const permutation = Int32Array.from({ length: SKEWED.length }, (_, i) => i);
    drawSimpleRandomSample(rng, permutation, 25);
    const sample = Array.from(permutation.subarray(0, 25), (i) => SKEWED[i]);
    const book = SKEWED.reduce((sum, s) => sum + Math.round(s.bookValue * 100), 0) / 100;
    const r = simulateEstimators({
      population: SKEWED,
      sampleSize: 25,
      trials: 1,
      seed: 42,
      confidence: 0.95,
      estimators: ["mean-per-unit", "difference", "ratio", "regression"],
    });
    for (const estimator of ["mean-per-unit", "difference", "ratio", "regression"] as const) {
      const e = evaluateVariables({
        estimator,
        populationSize: SKEWED.length,
        populationBookValue: book,
        sample,
        confidence: 0.95,
        sides: "two",
      });
      expect(r[estimator].meanEstimate).toBeCloseTo(e.estimatedAuditedValue, 4);
      expect(r[estimator].meanAllowance).toBeCloseTo(e.allowance, 4);
    }
  });

  it("the ratio estimator's bias shrinks roughly in proportion to 1/n (Cochran 1977 ch. 6)", () => {
    // y = 100 + x + noise: the regression line misses the origin, so R̂ has a first-order bias
    // (1 − f)/(n X̄²)·(R S_x² − S_xy), O(1/n) (Cochran 1977 ch. 6, section from memory). Doubling n
    // should roughly halve it; simulation noise allows 1.5–2.7.
    const pop = population(10000, 8, (u) => {
      const book = 20 + 380 * u();
      return [book, 100 + book + 20 * (u() - 0.5)];
    });
    const bias = (n: number) =>
      simulateEstimators({
        population: pop,
        sampleSize: n,
        trials: 20000,
        seed: 99,
        confidence: 0.95,
        estimators: ["ratio"],
      }).ratio.bias;
    const [b10, b20, b40] = [bias(10), bias(20), bias(40)];
    expect(b10).toBeGreaterThan(0);
    expect(b10 / b20).toBeGreaterThan(1.5);
    expect(b10 / b20).toBeLessThan(2.7);
    expect(b20 / b40).toBeGreaterThan(1.5);
    expect(b20 / b40).toBeLessThan(2.7);
  });

  it("mean-per-unit coverage is near nominal on a large symmetric population", () => {
    // CLT: on a symmetric population the normal bound's coverage is close to its confidence
    // (Cochran 1977 §2.15); 4,000 trials give a Monte Carlo SE of about 0.0034 at 95%.
    const pop = population(20000, 5, (u) => {
      const book = 1000 + 400 * (u() + u() + u() - 1.5);
      return [book, book];
    });
    const r = simulateEstimators({
      population: pop,
      sampleSize: 200,
      trials: 4000,
      seed: 17,
      confidence: 0.95,
      estimators: ["mean-per-unit"],
    });
    expect(r["mean-per-unit"].coverage).toBeGreaterThan(0.935);
    expect(r["mean-per-unit"].coverage).toBeLessThan(0.965);
    expect(Math.abs(r["mean-per-unit"].bias)).toBeLessThan(
      (3 * r["mean-per-unit"].standardDeviation) / Math.sqrt(4000),
    );
  });

  it("histograms count every trial and span the estimates", () => {
    const r = simulateEstimators({
      population: SKEWED,
      sampleSize: 40,
      trials: 500,
      seed: 1,
      confidence: 0.95,
      estimators: ["difference"],
    });
    const h = r.difference.histogram;
    expect(h.reduce((sum, b) => sum + b.count, 0)).toBe(500);
    expect(h).toHaveLength(20);
    for (let i = 1; i < h.length; i++) expect(h[i].from).toBeCloseTo(h[i - 1].to, 6);
  });

  it("a population without misstatement gives zero bias and zero spread for difference and ratio", () => {
    const clean = SKEWED.map((s) => ({ bookValue: s.bookValue, auditedValue: s.bookValue }));
    const r = simulateEstimators({
      population: clean,
      sampleSize: 20,
      trials: 50,
      seed: 1,
      confidence: 0.95,
      estimators: ["difference", "ratio"],
    });
    expect(r.difference.bias).toBeCloseTo(0, 6);
    expect(r.difference.standardDeviation).toBeCloseTo(0, 6);
    expect(r.ratio.bias).toBeCloseTo(0, 4);
    expect(r.difference.histogram).toHaveLength(1);
  });

  describe("rejects bad input", () => {
    const ok = {
      population: SKEWED,
      sampleSize: 10,
      trials: 10,
      seed: 1,
      confidence: 0.95,
      estimators: ["difference" as const],
    };
    it("an empty estimator list", () =>
      expect(() => simulateEstimators({ ...ok, estimators: [] })).toThrow(/estimators must name at least one/));
    it("a repeated estimator", () =>
      expect(() => simulateEstimators({ ...ok, estimators: ["ratio", "ratio"] })).toThrow(/estimators\[1\] repeats/));
    it("an unknown estimator", () =>
      expect(() => simulateEstimators({ ...ok, estimators: ["median" as "ratio"] })).toThrow(
        /estimators\[0\] must be one of/,
      ));
    it("a sample larger than the population", () =>
      expect(() => simulateEstimators({ ...ok, sampleSize: 3001 })).toThrow(
        /sampleSize must be an integer between 2 and 3000/,
      ));
    it("sample size 2 with regression", () =>
      expect(() => simulateEstimators({ ...ok, sampleSize: 2, estimators: ["regression"] })).toThrow(
        /sampleSize must be an integer between 3/,
      ));
    it("zero trials", () => expect(() => simulateEstimators({ ...ok, trials: 0 })).toThrow(/trials/));
    it("a one-item population", () =>
      expect(() => simulateEstimators({ ...ok, population: SKEWED.slice(0, 1) })).toThrow(
        /population must hold at least 2/,
      ));
    it("a zero book value with the Hartley–Ross estimator, naming the item", () =>
      expect(() =>
        simulateEstimators({
          ...ok,
          estimators: ["hartley-ross"],
          population: [...SKEWED.slice(0, 5), { bookValue: 0, auditedValue: 0 }],
        }),
      ).toThrow(/population\[5\]\.bookValue is zero/));
    it("a population item with 3 decimals", () =>
      expect(() =>
        simulateEstimators({ ...ok, population: [{ bookValue: 1.001, auditedValue: 1 }, ...SKEWED.slice(0, 5)] }),
      ).toThrow(/population\[0\]\.bookValue must have at most 2 decimals/));
  });
});

describe("simulateEstimators — one-sided bounds, proportional ledgers, progress", () => {
  const symmetric = population(20000, 5, (u) => {
    const book = 1000 + 400 * (u() + u() + u() - 1.5);
    return [book, book];
  });

  it("a one-sided bound's coverage is near its confidence on a symmetric population", () => {
    // CLT (Cochran 1977 §2.15): one-sided normal bound at z_0.95 = 1.645 covers about 95%.
    for (const sides of ["lower", "upper"] as const) {
      const r = simulateEstimators({
        population: symmetric,
        sampleSize: 200,
        trials: 4000,
        seed: 23,
        confidence: 0.95,
        estimators: ["mean-per-unit"],
        sides,
      });
      expect(r["mean-per-unit"].coverage).toBeGreaterThan(0.935);
      expect(r["mean-per-unit"].coverage).toBeLessThan(0.965);
    }
  });

  it("when audited values are proportional to book values, the ratio estimator's RMSE beats mean-per-unit's", () => {
    // Cochran 1977 §6.8: the ratio estimator beats the simple expansion when y is proportional to x
    // and x varies (ρ > CV(x)/(2·CV(y))).
    const proportional = population(5000, 13, (u) => {
      const book = 50 + 5000 * u() ** 2;
      return [book, book * (0.9 + 0.02 * u())];
    });
    const r = simulateEstimators({
      population: proportional,
      sampleSize: 100,
      trials: 2000,
      seed: 2,
      confidence: 0.95,
      estimators: ["mean-per-unit", "ratio"],
    });
    expect(r.ratio.rmse).toBeLessThan(r["mean-per-unit"].rmse / 10);
  });

  it("reports progress every 500 trials", () => {
    const seen: number[] = [];
    simulateEstimators({
      population: SKEWED,
      sampleSize: 20,
      trials: 1500,
      seed: 1,
      confidence: 0.95,
      estimators: ["ratio"],
      onProgress: (d) => seen.push(d),
    });
    expect(seen).toEqual([500, 1000, 1500]);
  });
});

describe("simulateEstimators — bias-corrected ratio estimators and non-positive book values", () => {
  const CORRECTED = ["hartley-ross", "jackknife-ratio", "beale-ratio", "tin-ratio"] as const;

  it("one trial reproduces correctedRatioEstimates on the same drawn sample", () => {
    const rng = createRng(7);
    const permutation = Int32Array.from({ length: SKEWED.length }, (_, i) => i);
    drawSimpleRandomSample(rng, permutation, 30);
    const sample = Array.from(permutation.subarray(0, 30), (i) => SKEWED[i]);
    const book = SKEWED.reduce((sum, s) => sum + Math.round(s.bookValue * 100), 0) / 100;
    const direct = correctedRatioEstimates({ sample, populationSize: SKEWED.length, populationBookValue: book });
    const r = simulateEstimators({
      population: SKEWED,
      sampleSize: 30,
      trials: 1,
      seed: 7,
      confidence: 0.95,
      estimators: [...CORRECTED],
    });
    for (const e of CORRECTED) expect(r[e].meanEstimate).toBeCloseTo(direct[e]!.estimate, 4);
  });

  it("Hartley–Ross is unbiased where the ratio estimator is not (y = 100 + x: Cochran 1977 §6.8)", () => {
    const pop = population(5000, 8, (u) => {
      const book = 20 + 380 * u();
      return [book, 100 + book + 20 * (u() - 0.5)];
    });
    const r = simulateEstimators({
      population: pop,
      sampleSize: 10,
      trials: 20000,
      seed: 5,
      confidence: 0.95,
      estimators: ["ratio", "hartley-ross", "jackknife-ratio"],
    });
    // Monte Carlo standard error of the mean estimate = sd / sqrt(trials): HR within 4 of them, ratio well outside.
    const mcse = (e: "ratio" | "hartley-ross" | "jackknife-ratio") => r[e].standardDeviation / Math.sqrt(20000);
    expect(Math.abs(r["hartley-ross"].bias)).toBeLessThan(4 * mcse("hartley-ross"));
    expect(Math.abs(r.ratio.bias)).toBeGreaterThan(8 * mcse("ratio"));
    expect(Math.abs(r["jackknife-ratio"].bias)).toBeLessThan(Math.abs(r.ratio.bias) / 3);
  });

  it("simulates ratio and regression on a population with a few negative and zero items", () => {
    const pop = [
      ...SKEWED.slice(0, 500),
      { bookValue: -250, auditedValue: -250 },
      { bookValue: 0, auditedValue: 0 },
      { bookValue: -40.5, auditedValue: -45 },
    ];
    const r = simulateEstimators({
      population: pop,
      sampleSize: 50,
      trials: 500,
      seed: 1,
      confidence: 0.95,
      estimators: ["ratio", "regression", "jackknife-ratio"],
    });
    expect(Number.isFinite(r.ratio.rmse)).toBe(true);
    expect(r.ratio.undefinedTrials).toBeUndefined();
    expect(r.regression.coverage).toBeGreaterThan(0.8);
  });

  it("counts trials whose sample book total is zero as undefined and not covered", () => {
    // Samples of 2 from {100, −100, 50}: one of the three pairs sums to zero.
    const pop = [
      { bookValue: 100, auditedValue: 100 },
      { bookValue: -100, auditedValue: -100 },
      { bookValue: 50, auditedValue: 50 },
    ];
    const r = simulateEstimators({
      population: pop,
      sampleSize: 2,
      trials: 3000,
      seed: 2,
      confidence: 0.95,
      estimators: ["ratio"],
    });
    expect(r.ratio.undefinedTrials! / 3000).toBeCloseTo(1 / 3, 1);
    expect(r.ratio.coverage * 3000).toBeLessThanOrEqual(3000 - r.ratio.undefinedTrials!);
  });
});
