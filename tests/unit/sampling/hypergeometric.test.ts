import { describe, expect, it } from "vitest";
import stdlibHypergeometricCdf from "@stdlib/stats-base-dists-hypergeometric-cdf";
import { attributeSampleSize, evaluateAttributes, hypergeometricCdf } from "@/lib/sampling";
import { smallestHypergeometricSize } from "@/lib/sampling/hypergeometric";

describe("hypergeometricCdf", () => {
  it("matches scipy.stats.hypergeom.cdf(k, N, M, n) quoted to 12 significant digits", () => {
    // Python 3.11.7 / scipy 1.17.1: hypergeom.cdf(k, N, M, n)
    const cases: [number, number, number, number, number][] = [
      [0, 100, 5, 45, 0.046206343362087114],
      [1, 100, 5, 45, 0.25005785819482435],
      [2, 200, 18, 59, 0.05683767886882486],
      [2, 200, 19, 59, 0.04296498205739576],
      [3, 1000, 73, 100, 0.05158395593031471],
      [5, 5000, 250, 93, 0.679404857963237],
      [10, 50000, 2500, 400, 0.009188434213562517],
    ];
    for (const [k, N, M, n, expected] of cases) expect(hypergeometricCdf(k, N, M, n) / expected).toBeCloseTo(1, 11);
  });

  it("agrees with @stdlib's hypergeometric CDF over a grid of N, M, n, k", () => {
    for (const N of [20, 57, 200, 1000, 4999]) {
      for (const M of [0, 1, Math.floor(N / 20), Math.floor(N / 3), N]) {
        for (const n of [1, Math.floor(N / 10), Math.floor(N / 2), N]) {
          for (const k of [0, 1, 2, 5, 20]) {
            // @stdlib cdf(x, N, K, n)
            expect(hypergeometricCdf(k, N, M, n)).toBeCloseTo(stdlibHypergeometricCdf(k, N, M, n), 10);
          }
        }
      }
    }
  });

  it("handles the support's edges: k below max(0, n − (N − M)) gives 0, k at min(n, M) gives 1", () => {
    expect(hypergeometricCdf(2, 10, 8, 5)).toBe(0); // at least 3 deviations must be drawn
    expect(hypergeometricCdf(3, 10, 8, 5)).toBeCloseTo(stdlibHypergeometricCdf(3, 10, 8, 5), 12);
    expect(hypergeometricCdf(4, 10, 4, 5)).toBe(1);
  });

  it("refuses M above N", () => expect(() => hypergeometricCdf(0, 10, 11, 5)).toThrow(/0 <= M <= N/));
});

describe("hypergeometric attribute sample sizes", () => {
  // Methods reference §1.3 grid, computed with scipy.stats.hypergeom (Python 3.11.7 / scipy 1.17.1):
  // smallest n with hypergeom.cdf(k, N, ceil(TDR·N), n) <= β, k fixed. null = no size exists.
  const GRID: { beta: number; tdr: number; k: number; sizes: (number | null)[] }[] = [
    { beta: 0.05, tdr: 0.05, k: 0, sizes: [19, 31, 45, 51, 56, 57, 59, 59] },
    { beta: 0.05, tdr: 0.05, k: 1, sizes: [null, 43, 65, 78, 87, 90, 93, 93] },
    { beta: 0.05, tdr: 0.1, k: 0, sizes: [16, 22, 25, 27, 28, 29, 29, 29] },
    { beta: 0.05, tdr: 0.1, k: 1, sizes: [20, 33, 39, 42, 44, 45, 46, 46] },
    { beta: 0.1, tdr: 0.05, k: 0, sizes: [18, 27, 37, 41, 43, 44, 45, 45] },
    { beta: 0.1, tdr: 0.05, k: 1, sizes: [null, 40, 58, 67, 73, 75, 76, 77] },
    { beta: 0.1, tdr: 0.1, k: 0, sizes: [14, 18, 20, 21, 22, 22, 22, 22] },
    { beta: 0.1, tdr: 0.1, k: 1, sizes: [19, 29, 33, 35, 37, 37, 38, 38] },
  ];
  const POPULATIONS = [20, 50, 100, 200, 500, 1000, 5000, 100000];

  it("reproduces the scipy grid for fixed k (N 20 … 100,000)", () => {
    for (const row of GRID) {
      POPULATIONS.forEach((N, j) => {
        const M = Math.ceil(row.tdr * N - 1e-9);
        const found = smallestHypergeometricSize({ N, M, risk: row.beta, allowed: () => row.k });
        expect(found?.n ?? null).toBe(row.sizes[j]);
      });
    }
  });

  it("attributeSampleSize with populationSize: N 100, TDR 5%, EDR 0, 95% → 45 (M 5), not the fpc shortcut's 37.1", () => {
    // Methods reference test T8 (scipy): hypergeom.cdf(0, 100, 5, 45) = 0.0462 <= 0.05, n = 44 gives 0.0512.
    expect(
      attributeSampleSize({ tolerableRate: 0.05, expectedRate: 0, confidence: 0.95, populationSize: 100 }),
    ).toEqual({ sampleSize: 45, allowedDeviations: 0, model: "hypergeometric", populationDeviations: 5 });
  });

  it("with an expected rate, k = ceil(EDR·n) as in the binomial search (scipy search quoted)", () => {
    // scipy: smallest n with hypergeom.cdf(ceil(EDR·n), N, ceil(TDR·N), n) <= β → (n, k, M)
    const cases: [number, number, number, number, number, number, number][] = [
      [5000, 0.05, 0.01, 0.95, 93, 1, 250],
      [1000, 0.05, 0.01, 0.95, 90, 1, 50],
      [500, 0.06, 0.025, 0.95, 118, 3, 30],
      [200, 0.1, 0.02, 0.9, 35, 1, 20],
      [2000, 0.04, 0.01, 0.95, 152, 2, 80],
      [300, 0.08, 0.04, 0.9, 91, 4, 24],
    ];
    for (const [N, tdr, edr, confidence, n, k, M] of cases) {
      expect(attributeSampleSize({ tolerableRate: tdr, expectedRate: edr, confidence, populationSize: N })).toEqual({
        sampleSize: n,
        allowedDeviations: k,
        model: "hypergeometric",
        populationDeviations: M,
      });
    }
  });

  it("is never larger than the binomial size and equals it at N = 100,000 (TDR 5%, EDR 1%, 95%: 93)", () => {
    for (const N of [50, 300, 2500, 100000]) {
      const hyper = attributeSampleSize({
        tolerableRate: 0.05,
        expectedRate: 0.01,
        confidence: 0.95,
        populationSize: N,
      });
      expect(hyper.sampleSize).toBeLessThanOrEqual(93);
    }
    expect(
      attributeSampleSize({ tolerableRate: 0.05, expectedRate: 0.01, confidence: 0.95, populationSize: 100000 })
        .sampleSize,
    ).toBe(93);
  });

  it("refuses a population with no size that meets the risk, naming populationSize and tolerableRate", () =>
    // N 20, TDR 5% → M 1; k = ceil(0.01·n) = 1 can never be rejected (methods reference "None").
    expect(() =>
      attributeSampleSize({ tolerableRate: 0.05, expectedRate: 0.01, confidence: 0.95, populationSize: 20 }),
    ).toThrow(/populationSize \(20\) with tolerableRate 0.05 \(1 deviations assumed\) has no sample size/));

  it("refuses a non-integer population size", () =>
    expect(() =>
      attributeSampleSize({ tolerableRate: 0.05, expectedRate: 0, confidence: 0.95, populationSize: 10.5 }),
    ).toThrow(/populationSize must be an integer/));
});

describe("hypergeometric attribute evaluation", () => {
  it("upper limit M_U = max{M : P(X <= k | N, M, n) > β} (scipy search quoted)", () => {
    // Methods reference T12 and §1.4: N 200, n 59, k 2, 5% → M_U 18 (9.0%); scipy hypergeom.cdf(2, 200, 18, 59) = 0.0568 > 0.05, (…, 19, …) = 0.0430.
    const cases: [number, number, number, number, number][] = [
      [200, 59, 2, 0.95, 18],
      [100, 45, 0, 0.95, 4],
      [500, 93, 1, 0.9, 19],
      [1000, 100, 3, 0.95, 73],
      [60, 60, 0, 0.95, 0],
      [60, 50, 50, 0.95, 60],
      [60, 50, 3, 0.95, 6],
    ];
    for (const [N, n, k, confidence, mu] of cases) {
      const r = evaluateAttributes({ sampleSize: n, deviations: k, confidence, populationSize: N });
      expect(r.model).toBe("hypergeometric");
      expect(r.upperDeviations).toBe(mu);
      expect(r.upperLimit).toBeCloseTo(mu / N, 12);
    }
  });

  it("table mode rounds the rate up to 0.1 percentage point", () => {
    // N 300, n 40, k 1 → M_U / N; rounded up to the next 0.001.
    const exact = evaluateAttributes({ sampleSize: 40, deviations: 1, confidence: 0.95, populationSize: 300 });
    const table = evaluateAttributes({
      sampleSize: 40,
      deviations: 1,
      confidence: 0.95,
      populationSize: 300,
      mode: "table",
    });
    expect(table.upperLimit).toBe(Math.ceil(exact.upperLimit * 1000 - 1e-9) / 1000);
  });

  it("is below the binomial Clopper–Pearson limit for a small population", () => {
    const hyper = evaluateAttributes({ sampleSize: 59, deviations: 2, confidence: 0.95, populationSize: 200 });
    const binomial = evaluateAttributes({ sampleSize: 59, deviations: 2, confidence: 0.95 });
    expect(binomial.model).toBe("binomial");
    expect(hyper.upperLimit).toBeLessThan(binomial.upperLimit); // 9.0% against 10.29%
  });

  it("refuses a population smaller than the sample", () =>
    expect(() => evaluateAttributes({ sampleSize: 59, deviations: 0, confidence: 0.95, populationSize: 50 })).toThrow(
      /populationSize must be an integer between 59/,
    ));
});
