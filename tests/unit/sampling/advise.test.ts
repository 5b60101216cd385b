import { describe, expect, it } from "vitest";
import { recommendEstimator, type AdvisorCell, type EstimatorPerformance } from "@/lib/sampling";

const perf = (p: Partial<EstimatorPerformance>): EstimatorPerformance => {
  const bias = p.bias ?? 0;
  const standardDeviation = p.standardDeviation ?? 1000;
  return {
    meanEstimate: 0,
    bias,
    standardDeviation,
    rmse: Math.hypot(bias, standardDeviation),
    coverage: p.coverage ?? 0.95,
    meanAllowance: 0,
    histogram: [],
  };
};

describe("recommendEstimator", () => {
  // The rule is Sondage's: lowest RMSE (MSE = bias² + variance, Cochran 1977 §1.8) among the
  // estimators whose coverage reaches the confidence less two Monte Carlo standard errors.
  const cells: AdvisorCell[] = [
    { estimator: "mean-per-unit", sampleSize: 40, performance: perf({ standardDeviation: 8000, coverage: 0.95 }) },
    { estimator: "difference", sampleSize: 40, performance: perf({ standardDeviation: 1000, coverage: 0.948 }) },
    { estimator: "ratio", sampleSize: 40, performance: perf({ standardDeviation: 900, coverage: 0.88 }) },
    {
      estimator: "regression",
      sampleSize: 40,
      performance: perf({ bias: 1500, standardDeviation: 800, coverage: 0.95 }),
    },
    { estimator: "mean-per-unit", sampleSize: 80, performance: perf({ standardDeviation: 5000, coverage: 0.95 }) },
  ];

  it("picks the lowest RMSE whose coverage is within two Monte Carlo SEs of the confidence", () => {
    const r = recommendEstimator({ cells, confidence: 0.95, trials: 10000, atSize: 40, misstatedShare: 0.1 });
    expect(r.coverageFloor).toBeCloseTo(0.95 - 2 * Math.sqrt((0.95 * 0.05) / 10000), 12);
    expect(r.recommended).toBe("difference");
    expect(r.verdicts[0]).toMatchObject({ estimator: "difference", verdict: "recommended" });
  });

  it("says why the others lose, in plain words", () => {
    const r = recommendEstimator({ cells, confidence: 0.95, trials: 10000, atSize: 40, misstatedShare: 0.1 });
    const reason = (e: string) => r.verdicts.find((v) => v.estimator === e)!.reason;
    expect(reason("mean-per-unit")).toBe(
      "Mean-per-unit: unbiased but its spread is 8.0 times wider (RMSE 8,000 against 1,000).",
    );
    expect(reason("ratio")).toBe(
      "Ratio: coverage 88% at n = 40, below the 95% confidence — too few misstatements expected (about 4 in the sample).",
    );
    expect(reason("regression")).toMatch(/^Regression: biased by 1,500 \(88% of its RMSE\)/);
  });

  it("falls back to the largest simulated size and says when nothing holds", () => {
    const r = recommendEstimator({
      cells: cells.map((c) => ({ ...c, performance: { ...c.performance, coverage: 0.5 } })),
      confidence: 0.95,
      trials: 1000,
    });
    expect(r.sampleSize).toBe(80);
    expect(r.recommended).toBeNull();
    expect(r.summary).toMatch(/No estimator's bound held the truth/);
  });
});

describe("recommendEstimator — bias-corrected ratio estimators as comparison rows", () => {
  const cells: AdvisorCell[] = [
    { estimator: "difference", sampleSize: 50, performance: perf({ standardDeviation: 1200, coverage: 0.95 }) },
    { estimator: "ratio", sampleSize: 50, performance: perf({ bias: -300, standardDeviation: 1000, coverage: 0.95 }) },
    {
      estimator: "hartley-ross",
      sampleSize: 50,
      performance: perf({ bias: 10, standardDeviation: 1400, coverage: 0.96 }),
    },
    {
      estimator: "jackknife-ratio",
      sampleSize: 50,
      performance: perf({ bias: -20, standardDeviation: 1030, coverage: 0.95 }),
    },
    {
      estimator: "tin-ratio",
      sampleSize: 50,
      performance: perf({ bias: -40, standardDeviation: 900, coverage: 0.95 }),
    },
  ];

  it("never recommends a comparison row, even with the lowest RMSE", () => {
    // RMSE: ratio √(300² + 1000²) = 1,044.03; Tin √(40² + 900²) = 900.89 (lowest) but a comparison row.
    const r = recommendEstimator({ cells, confidence: 0.95, trials: 10000, atSize: 50 });
    expect(r.recommended).toBe("ratio");
    expect(r.verdicts.filter((v) => v.verdict === "comparison").map((v) => v.estimator)).toEqual([
      "hartley-ross",
      "jackknife-ratio",
      "tin-ratio",
    ]);
    expect(r.verdicts.find((v) => v.estimator === "hartley-ross")!.reason).toBe(
      "Hartley–Ross (unbiased ratio-type) (for comparison): bias 10, RMSE 1,400, coverage 96%; the plain ratio estimator: bias 300, RMSE 1,044.",
    );
  });

  it("says in plain words when a corrected estimator is less biased but worse on RMSE", () => {
    // Hartley–Ross: |bias| 10 < 300 but RMSE 1,400.04 > 1,044.03; jackknife: |bias| 20 < 300, RMSE √(20² + 1030²) = 1,030.19 < 1,044.03 (better: not listed).
    const r = recommendEstimator({ cells, confidence: 0.95, trials: 10000, atSize: 50 });
    expect(r.tradeOff).toBe(
      "Hartley–Ross removes most of the ratio estimator's bias (300) but its extra spread costs more than the bias removed: RMSE 1,400 against 1,044. On this population the plain ratio estimator is the better choice of the ratio forms.",
    );
  });

  it("has no trade-off line when no corrected estimator is worse on RMSE", () => {
    expect(
      recommendEstimator({
        cells: cells.filter((c) => c.estimator !== "hartley-ross"),
        confidence: 0.95,
        trials: 10000,
        atSize: 50,
      }).tradeOff,
    ).toBeNull();
  });
});
