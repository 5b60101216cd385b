import { describe, expect, it } from "vitest";
import { jStat } from "jstat";
import stdlibGammaQuantile from "@stdlib/stats-base-dists-gamma-quantile";
import { musConfidenceFactor, poissonFactor } from "@/lib/sampling";

const CONFIDENCES = [0.5, 0.63, 0.7, 0.75, 0.8, 0.85, 0.9, 0.95, 0.99];
const RATIOS = [0, 0.01, 0.05, 0.1, 0.15, 0.2, 0.25, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9];

// Python 3.11.7 / scipy 1.17.1: brentq(lambda R: gamma.ppf(c, 1 + R*r) - R, -log(1-c), hi, xtol=1e-14), 6 dp.
const SCIPY: { confidence: number; exact: number[]; table: number[] }[] = [
  {
    confidence: 0.95,
    exact: [2.995732, 3.308902, 3.675014, 4.620162, 5.990229, 8.086363, 11.536848],
    table: [3.0, 3.31, 3.68, 4.63, 6.0, 8.09, 11.54],
  },
  {
    confidence: 0.9,
    exact: [2.302585, 2.517655, 2.767794, 3.408531, 4.32777, 5.71882, 7.981804],
    table: [2.31, 2.52, 2.77, 3.41, 4.33, 5.72, 7.99],
  },
  {
    confidence: 0.8,
    exact: [1.609438, 1.736839, 1.883399, 2.252401, 2.769609, 3.533071, 4.741896],
    table: [1.61, 1.74, 1.89, 2.26, 2.77, 3.54, 4.75],
  },
  {
    confidence: 0.63,
    exact: [0.994252, 1.05594, 1.125542, 1.295251, 1.52235, 1.840253, 2.313295],
    table: [1.0, 1.06, 1.13, 1.3, 1.53, 1.85, 2.32],
  },
  {
    confidence: 0.99,
    exact: [4.60517, 5.174117, 5.840323, 7.566608, 10.086418, 13.97629, 20.446008],
    table: [4.61, 5.18, 5.85, 7.57, 10.09, 13.98, 20.45],
  },
];
const SCIPY_RATIOS = [0, 0.05, 0.1, 0.2, 0.3, 0.4, 0.5];

describe("musConfidenceFactor", () => {
  it("solves R = gamma quantile(confidence; shape 1 + R·EM/TM) by jstat AND @stdlib over a grid of confidences and ratios", () => {
    for (const confidence of CONFIDENCES) {
      for (const ratio of RATIOS) {
        const r = musConfidenceFactor({ confidence, expectedToTolerable: ratio });
        // jStat 1.9 gamma.inv and @stdlib gamma quantile (scale 1 = rate 1) are independent implementations.
        expect(Math.abs(jStat.gamma.inv(confidence, 1 + r * ratio, 1) - r) / r).toBeLessThan(1e-9);
        expect(Math.abs(stdlibGammaQuantile(confidence, 1 + r * ratio, 1) - r) / r).toBeLessThan(1e-9);
      }
    }
  });

  it("matches scipy's root to 6 decimals, and the table mode rounds it up to 2 decimals", () => {
    for (const row of SCIPY) {
      SCIPY_RATIOS.forEach((ratio, j) => {
        expect(musConfidenceFactor({ confidence: row.confidence, expectedToTolerable: ratio })).toBeCloseTo(
          row.exact[j],
          6,
        );
        expect(musConfidenceFactor({ confidence: row.confidence, expectedToTolerable: ratio, mode: "table" })).toBe(
          row.table[j],
        );
      });
    }
  });

  it("95% row at ratios 0–0.50 equals the Guide's printed confidence-factor row (from memory: 3.00 3.31 3.68 4.63 6.00 8.09 11.54)", () => {
    expect(
      SCIPY_RATIOS.map((ratio) => musConfidenceFactor({ confidence: 0.95, expectedToTolerable: ratio, mode: "table" })),
    ).toEqual([3.0, 3.31, 3.68, 4.63, 6.0, 8.09, 11.54]);
  });

  it("a ratio of 0 gives RF(0) in either mode (3.00 at 95% in table mode)", () => {
    for (const confidence of CONFIDENCES) {
      expect(musConfidenceFactor({ confidence, expectedToTolerable: 0 })).toBe(poissonFactor(0, confidence, "exact"));
      expect(musConfidenceFactor({ confidence, expectedToTolerable: 0, mode: "table" })).toBe(
        poissonFactor(0, confidence, "table"),
      );
    }
    expect(musConfidenceFactor({ confidence: 0.95, expectedToTolerable: 0, mode: "table" })).toBe(3);
  });

  it("grows with the ratio and with the confidence", () => {
    for (const confidence of CONFIDENCES) {
      const row = RATIOS.map((ratio) => musConfidenceFactor({ confidence, expectedToTolerable: ratio }));
      row.forEach((r, j) => j > 0 && expect(r).toBeGreaterThan(row[j - 1]));
    }
    expect(musConfidenceFactor({ confidence: 0.95, expectedToTolerable: 0.2 })).toBeGreaterThan(
      musConfidenceFactor({ confidence: 0.9, expectedToTolerable: 0.2 }),
    );
  });

  describe("refuses", () => {
    it("a ratio of 1 or more, naming expectedToTolerable", () => {
      expect(() => musConfidenceFactor({ confidence: 0.95, expectedToTolerable: 1 })).toThrow(
        /expectedToTolerable must be at least 0 and below 1/,
      );
      expect(() => musConfidenceFactor({ confidence: 0.95, expectedToTolerable: 1.5 })).toThrow(/expectedToTolerable/);
    });
    it("a negative ratio", () =>
      expect(() => musConfidenceFactor({ confidence: 0.95, expectedToTolerable: -0.1 })).toThrow(
        /expectedToTolerable/,
      ));
    it("a ratio whose root lies beyond any practical sample, naming both fields", () =>
      expect(() => musConfidenceFactor({ confidence: 0.95, expectedToTolerable: 0.9999 })).toThrow(
        /expectedToTolerable \(0.9999\) at confidence 0.95 has no confidence factor/,
      ));
    it("a confidence outside (0, 1)", () =>
      expect(() => musConfidenceFactor({ confidence: 1, expectedToTolerable: 0.1 })).toThrow(
        /confidence must be strictly between 0 and 1/,
      ));
    it("an unknown mode", () =>
      expect(() =>
        musConfidenceFactor({ confidence: 0.95, expectedToTolerable: 0.1, mode: "rounded" as "table" }),
      ).toThrow(/mode must be one of/));
  });
});
