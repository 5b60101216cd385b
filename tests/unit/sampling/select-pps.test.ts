import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { createRng, selectPps } from "@/lib/sampling";

/** Canonical 20-item invoice population (ids INV001..INV020), book values in currency units. */
const INVOICES = [
  1250.0, 480.5, 0.0, 3625.75, 910.2, 12500.0, 155.0, -420.0, 2300.1, 777.77, 4100.0, 59.99, 1823.45, 960.0, 3333.33,
  1200.0, 645.0, 2750.0, 199.99, 888.88,
];

/** Independent re-performance: list every point, then find its item by a linear scan of cumulative cents. */
function byPoints(bookValues: number[], intervalCents: number, startCents: number): Map<number, number[]> {
  const cumulative: { index: number; upper: number }[] = [];
  let c = 0;
  bookValues.forEach((v, index) => {
    const cents = Math.round(v * 100);
    if (cents > 0) cumulative.push({ index, upper: (c += cents) });
  });
  const hits = new Map<number, number[]>();
  for (let p = startCents; p <= c; p += intervalCents) {
    const item = cumulative.find((e) => p <= e.upper)!;
    hits.set(item.index, [...(hits.get(item.index) ?? []), p / 100]);
  }
  return hits;
}

describe("selectPps (systematic monetary-unit selection)", () => {
  it("excludes zero and negative items and totals the positive frame in cents", () => {
    // Frame: 18 positive items totalling 37,959.96; INV003 (0.00) and INV008 (−420.00) excluded (hand sum of the list).
    const r = selectPps({ bookValues: INVOICES, interval: 4744.99, seed: 5489 });
    expect(r.excluded).toEqual([2, 7]);
    expect(r.frameTotal).toBe(37959.96);
  });

  it("reproduces the published systematic PPS hit list for the start 310,677 cents", () => {
    // Worked selection example (interval 474,499 cents, start 310,677): hits INV004, INV006 ×3,
    // INV011, INV013, INV015, INV018 (computed with Python in the methods reference's selection.py;
    // the start came from another generator there). Seed 1206281 gives that start here: numpy
    // RandomState(1206281).random_sample() = 0.6547467429185535 → 1 + floor(u · 474,499) = 310,677.
    const r = selectPps({ bookValues: INVOICES, interval: 4744.99, seed: 1206281 });
    expect(r.randomStart).toBe(3106.77);
    expect(r.hits.map((h) => [h.index, h.hitPoints.length])).toEqual([
      [3, 1],
      [5, 3],
      [10, 1],
      [12, 1],
      [14, 1],
      [17, 1],
    ]);
    expect(r.hits[1].hitPoints).toEqual([7851.76, 12596.75, 17341.74]);
  });

  it("hits 9 points, not 8, when the start is at most 4 cents with interval 4,744.99", () => {
    // 8 × 474,499 = 3,795,992 cents, so p_8 = r + 3,795,992 <= 3,795,996 exactly when r <= 4 (hand computation).
    // Seed 121285: numpy RandomState(121285).random_sample() = 3.999558920275703e-06 → r = 1 + floor(u · 474,499) = 2.
    const r = selectPps({ bookValues: INVOICES, interval: 4744.99, seed: 121285 });
    expect(r.randomStart).toBe(0.02);
    expect(r.hits.reduce((sum, h) => sum + h.hitPoints.length, 0)).toBe(9);
    expect(new Map(r.hits.map((h) => [h.index, h.hitPoints]))).toEqual(byPoints(INVOICES, 474499, 2));
  });

  it("hits the item at or above the interval on every point that falls in it", () => {
    // INV006 (12,500.00 >= 4,744.99) spans 1,250,000 cents: 2 or 3 points of a 474,499-cent interval.
    for (const seed of [1, 2, 3, 4, 5]) {
      const r = selectPps({ bookValues: INVOICES, interval: 4744.99, seed });
      const inv006 = r.hits.find((h) => h.index === 5);
      expect(inv006?.hitPoints.length === 2 || inv006?.hitPoints.length === 3).toBe(true);
    }
  });

  it("uses r = 1 + floor(u_0 J) with J the interval in cents", () => {
    const u0 = createRng(77).nextDouble();
    expect(selectPps({ bookValues: INVOICES, interval: 4744.99, seed: 77 }).randomStart).toBe(
      (1 + Math.floor(u0 * 474499)) / 100,
    );
  });

  it("hits nothing when the frame total is below the start", () => {
    const r = selectPps({ bookValues: [1, 2], interval: 1000, seed: 5489 });
    expect(r.hits).toEqual([]);
  });

  it("property: hits agree with point-by-point re-performance; hit count = number of points; items >= interval always hit", () => {
    const cents = fc.integer({ min: -50000, max: 2000000 }).map((c) => c / 100);
    fc.assert(
      fc.property(
        fc.array(cents, { minLength: 1, maxLength: 60 }),
        fc.integer({ min: 50000, max: 3000000 }),
        fc.integer({ min: 0, max: 4294967295 }),
        (values, intervalCents, seed) => {
          const r = selectPps({ bookValues: values, interval: intervalCents / 100, seed });
          const start = Math.round(r.randomStart * 100);
          const total = Math.round(r.frameTotal * 100);
          const points = total >= start ? Math.floor((total - start) / intervalCents) + 1 : 0;
          expect(r.hits.reduce((sum, h) => sum + h.hitPoints.length, 0)).toBe(points);
          expect(new Map(r.hits.map((h) => [h.index, h.hitPoints]))).toEqual(byPoints(values, intervalCents, start));
          values.forEach((v, i) => {
            if (Math.round(v * 100) >= intervalCents) expect(r.hits.some((h) => h.index === i)).toBe(true);
            if (Math.round(v * 100) <= 0) expect(r.excluded).toContain(i);
          });
          const indices = r.hits.map((h) => h.index);
          expect(new Set(indices).size).toBe(indices.length);
          expect([...indices].sort((a, b) => a - b)).toEqual(indices);
        },
      ),
      { numRuns: 300 },
    );
  });

  describe("rejects bad input", () => {
    it("a book value with more than 2 decimals, naming the item", () =>
      expect(() => selectPps({ bookValues: [10, 12.345], interval: 5, seed: 1 })).toThrow(
        /bookValues\[1\] must have at most 2 decimals/,
      ));
    it("a non-numeric book value", () =>
      expect(() => selectPps({ bookValues: [10, "x" as unknown as number], interval: 5, seed: 1 })).toThrow(TypeError));
    it("an infinite book value", () =>
      expect(() => selectPps({ bookValues: [Infinity], interval: 5, seed: 1 })).toThrow(
        /bookValues\[0\] must be finite/,
      ));
    it("a zero interval", () =>
      expect(() => selectPps({ bookValues: [10], interval: 0, seed: 1 })).toThrow(
        /interval must be greater than zero/,
      ));
    it("an interval below one cent", () =>
      expect(() => selectPps({ bookValues: [10], interval: 0.004, seed: 1 })).toThrow(/interval/));
    it("bookValues that is not an array", () =>
      expect(() => selectPps({ bookValues: 5 as unknown as number[], interval: 1, seed: 1 })).toThrow(TypeError));
    it("a total beyond the exact range in cents", () =>
      expect(() => selectPps({ bookValues: [5e13, 5e13], interval: 1e12, seed: 1 })).toThrow(/exact range/));
    it("an interval giving more than 1,000,000 selection points", () =>
      expect(() => selectPps({ bookValues: [20000], interval: 0.01, seed: 1 })).toThrow(
        /too small for this population/,
      ));
  });
});
