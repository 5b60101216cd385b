import { describe, expect, it } from "vitest";
import {
  assumeAuditedValues,
  createRng,
  evaluateMus,
  selectPps,
  simulateStringer,
  type SampledItem,
} from "@/lib/sampling";

const rng = createRng(77);
const BOOK = Array.from({ length: 5000 }, () => Math.round((20 + 3000 * rng.nextDouble() ** 3) * 100) / 100);
const withAudited = (audited: number[]): SampledItem[] =>
  BOOK.map((b, i) => ({ bookValue: b, auditedValue: audited[i] }));
const MISSTATED = withAudited(
  assumeAuditedValues({
    bookValues: BOOK,
    seed: 21,
    scenario: { kind: "pattern", misstatedShare: 0.04, tainting: "spread", overstatementShare: 1 },
  }),
);
const bookTotal = BOOK.reduce((s, b) => s + Math.round(b * 100), 0) / 100;

describe("simulateStringer", () => {
  it("a clean population: the bound is RF(0)·J = 3.00·J at 95% and always holds", () => {
    // AICPA Audit Guide "Audit Sampling", MUS confidence factors: 3.00 for no misstatements at 5% risk
    // of incorrect acceptance; the exact factor is −ln 0.05 = 2.9957.
    const clean = withAudited(BOOK);
    const r = simulateStringer({ population: clean, sampleSize: 100, trials: 200, seed: 1, confidence: 0.95 });
    expect(r.coverage).toBe(1);
    expect(r.bias).toBeCloseTo(0, 6);
    expect(r.standardDeviation).toBeCloseTo(0, 6);
    expect(r.meanAllowance / r.interval).toBeCloseTo(-Math.log(0.05), 4);
  });

  it("its first trial is the selectPps selection evaluated by evaluateMus", () => {
    const r = simulateStringer({ population: MISSTATED, sampleSize: 120, trials: 1, seed: 4242, confidence: 0.95 });
    const selection = selectPps({ bookValues: BOOK, interval: r.interval, seed: 4242 });
    const top = selection.hits.filter((h) => BOOK[h.index] >= r.interval).map((h) => MISSTATED[h.index]);
    const sample = selection.hits.filter((h) => BOOK[h.index] < r.interval).map((h) => MISSTATED[h.index]);
    const e = evaluateMus({ interval: r.interval, confidence: 0.95, sample, topStratum: top });
    expect(r.topStratumItems).toBe(BOOK.filter((b) => b >= r.interval).length);
    expect(r.meanEstimate).toBeCloseTo(bookTotal - e.mostLikelyMisstatement, 4);
    expect(r.meanAllowance).toBeCloseTo(e.netUpperLimits.overstatement - e.mostLikelyMisstatement, 4);
  });

  it("is conservative on overstatements with taintings in (0, 1]: coverage at least nominal", () => {
    // Simulation studies find the Stringer bound's actual confidence above its nominal level
    // (Plante, Neter & Leitch 1985, Auditing: A Journal of Practice & Theory) — empirical, not proven.
    const r = simulateStringer({ population: MISSTATED, sampleSize: 80, trials: 2000, seed: 9, confidence: 0.9 });
    expect(r.coverage).toBeGreaterThanOrEqual(0.9);
  });

  it("rmse² = bias² + sd², the same seed gives the same figures, histograms count every trial", () => {
    const run = () =>
      simulateStringer({ population: MISSTATED, sampleSize: 60, trials: 700, seed: 3, confidence: 0.95 });
    const r = run();
    expect(r.rmse / Math.hypot(r.bias, r.standardDeviation)).toBeCloseTo(1, 12);
    expect(run()).toEqual(r);
    expect(r.histogram.reduce((s, b) => s + b.count, 0)).toBe(700);
  });

  it("reports progress every 500 trials", () => {
    const seen: number[] = [];
    simulateStringer({
      population: MISSTATED,
      sampleSize: 30,
      trials: 1200,
      seed: 3,
      confidence: 0.95,
      onProgress: (d) => seen.push(d),
    });
    expect(seen).toEqual([500, 1000]);
  });

  it("rejects bad input naming the field", () => {
    const ok = { population: MISSTATED, sampleSize: 10, trials: 10, seed: 1, confidence: 0.95 };
    expect(() => simulateStringer({ ...ok, sampleSize: 0 })).toThrow(/sampleSize/);
    expect(() => simulateStringer({ ...ok, trials: 0 })).toThrow(/trials/);
    expect(() => simulateStringer({ ...ok, sides: "both" as "two" })).toThrow(/sides must be one of/);
    expect(() =>
      simulateStringer({
        ...ok,
        population: [
          { bookValue: -1, auditedValue: -1 },
          { bookValue: 0, auditedValue: 0 },
        ],
      }),
    ).toThrow(/positive book value/);
  });
});
