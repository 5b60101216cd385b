import { describe, expect, it } from "vitest";
import { jStat } from "jstat";
import stdlibNormalQuantile from "@stdlib/stats-base-dists-normal-quantile";
import stdlibGammaQuantile from "@stdlib/stats-base-dists-gamma-quantile";
import stdlibBetaQuantile from "@stdlib/stats-base-dists-beta-quantile";
import stdlibBinomialCdf from "@stdlib/stats-base-dists-binomial-cdf";
import { betaQuantile, binomialCdf, gammaQuantile, normalQuantile } from "@/lib/sampling/quantiles";

// Cross-checks of jStat (the engine's distribution library) against @stdlib, an independent
// implementation, over the grids the engine uses.
describe("normalQuantile against @stdlib normal quantile", () => {
  it("agrees to 1e-12 on p = 0.0005 .. 0.9995", () => {
    for (let i = 1; i < 2000; i++) {
      const p = i / 2000;
      expect(Math.abs(normalQuantile(p) - stdlibNormalQuantile(p, 0, 1))).toBeLessThan(1e-12);
    }
  });
  it("gives the published z values", () => {
    // R 4.2.2: qnorm(0.975) = 1.9599639845, qnorm(0.95) = 1.6448536270
    expect(normalQuantile(0.975)).toBeCloseTo(1.9599639845, 9);
    expect(normalQuantile(0.95)).toBeCloseTo(1.644853627, 9);
  });
  it("rejects p outside (0, 1)", () => {
    expect(() => normalQuantile(0)).toThrow(RangeError);
    expect(() => normalQuantile(1)).toThrow(RangeError);
  });
});

describe("gammaQuantile against @stdlib gamma quantile", () => {
  it("agrees to 1e-10 relative for shapes 1..31 at audit confidences", () => {
    for (const c of [0.5, 0.63, 0.7, 0.75, 0.8, 0.85, 0.9, 0.95, 0.99, 0.999]) {
      for (let shape = 1; shape <= 31; shape++) {
        const ref = stdlibGammaQuantile(c, shape, 1);
        expect(Math.abs(gammaQuantile(c, shape) - ref) / ref).toBeLessThan(1e-10);
      }
    }
  });
  it("rejects a non-positive shape", () => expect(() => gammaQuantile(0.95, 0)).toThrow(RangeError));
});

describe("betaQuantile against @stdlib beta quantile", () => {
  it("agrees to 1e-8 relative over the attribute-evaluation grid", () => {
    for (const c of [0.8, 0.9, 0.95, 0.99]) {
      for (const n of [20, 45, 59, 93, 150, 200, 1000]) {
        for (const k of [0, 1, 2, 3, 5, 10]) {
          const ref = stdlibBetaQuantile(c, k + 1, n - k);
          expect(Math.abs(betaQuantile(c, k + 1, n - k) - ref) / ref).toBeLessThan(1e-8);
        }
      }
    }
  });
  it("rejects p outside (0, 1)", () => expect(() => betaQuantile(1.2, 1, 2)).toThrow(RangeError));
});

describe("binomialCdf against @stdlib binomial cdf", () => {
  const grid: [number, number, number][] = [];
  for (const n of [10, 59, 93, 181, 1000, 5000, 16852]) {
    for (const k of [0, 1, 2, 5, 10, 50, 632]) {
      for (const p of [0.01, 0.02, 0.04, 0.05, 0.1, 0.2]) if (k < n) grid.push([k, n, p]);
    }
  }
  it("the engine's log-space sum agrees to 1e-11 relative", () => {
    for (const [k, n, p] of grid) {
      const ref = stdlibBinomialCdf(k, n, p);
      if (ref > 1e-250) expect(Math.abs(binomialCdf(k, n, p) - ref) / ref).toBeLessThan(1e-11);
    }
  });
  it("jStat's binomial.cdf (rounded to 1e-10 by design) agrees to 1e-9 absolute", () => {
    for (const [k, n, p] of grid)
      expect(Math.abs(jStat.binomial.cdf(k, n, p) - stdlibBinomialCdf(k, n, p))).toBeLessThan(1e-9);
  });
  it("handles the edges k < 0, k >= n, p = 0 and p = 1", () => {
    expect(binomialCdf(-1, 10, 0.3)).toBe(0);
    expect(binomialCdf(10, 10, 0.3)).toBe(1);
    expect(binomialCdf(3, 10, 0)).toBe(1);
    expect(binomialCdf(3, 10, 1)).toBe(0);
  });
  it("rejects a non-integer n", () => expect(() => binomialCdf(1, 2.5, 0.1)).toThrow(RangeError));
});
