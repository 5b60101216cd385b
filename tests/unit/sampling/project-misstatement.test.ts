import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { projectMisstatement, type SampledItem } from "@/lib/sampling";

/** n items of book `book` each, the first carrying `over` of overstatement. */
function items(n: number, book: number, over: number): SampledItem[] {
  return Array.from({ length: n }, (_, i) => ({ bookValue: book, auditedValue: i === 0 ? book - over : book }));
}

describe("projectMisstatement", () => {
  it("difference method reproduces the PCAOB AS 2315.26 example", () => {
    // PCAOB AS 2315.26: every twentieth item (50 items) from a population of 1,000 items; overstatements
    // of $3,000 in the sample project to a $60,000 overstatement.
    const r = projectMisstatement({
      method: "difference",
      sample: items(50, 400, 3000),
      remainderBookValue: 400000,
      remainderItemCount: 1000,
    });
    expect(r.projectedMisstatement).toBe(60000);
    expect(r.keyItemsMisstatement).toBe(0);
    expect(r.total).toBe(60000);
    expect(r.sampleMisstatement).toBe(3000);
    expect(r.rate).toBe(60);
  });

  it("AS 2315.26: the projection is added to the misstatement of items examined 100 percent", () => {
    // PCAOB AS 2315.26: "The auditor should add that projection to the misstatements discovered in any items examined 100 percent."
    const keyItems = [
      { bookValue: 120000, auditedValue: 117500 },
      { bookValue: 90000, auditedValue: 90000 },
    ];
    const r = projectMisstatement({
      method: "difference",
      sample: items(50, 400, 3000),
      remainderBookValue: 400000,
      remainderItemCount: 1000,
      keyItems,
    });
    expect(r.keyItemsMisstatement).toBe(2500);
    expect(r.total).toBe(62500);
  });

  it("ratio method reproduces the textbook inventory projection", () => {
    // Messier, Glover & Prawitt, Auditing & Assurance Services (McGraw-Hill, 2006), ch. 9: inventory book value
    // €3,000,000; items sampled €100,000 book, €98,000 audited; misstatement ratio 2 % → €60,000 projected.
    const sample = [
      { bookValue: 60000, auditedValue: 59000 },
      { bookValue: 40000, auditedValue: 39000 },
    ];
    const r = projectMisstatement({ method: "ratio", sample, remainderBookValue: 3000000, remainderItemCount: 500 });
    expect(r.rate).toBeCloseTo(0.02, 12);
    expect(r.projectedMisstatement).toBe(60000);
    expect(r.sampleBookValue).toBe(100000);
  });

  it("understatements project as negative amounts and net against overstatements", () => {
    // common practice: misstatement = book − audited, so an understatement is negative; ratio 100/1000 × 50,000 = 5,000 net.
    const sample = [
      { bookValue: 500, auditedValue: 300 },
      { bookValue: 500, auditedValue: 600 },
    ];
    const r = projectMisstatement({ method: "ratio", sample, remainderBookValue: 50000, remainderItemCount: 100 });
    expect(r.projectedMisstatement).toBe(5000);
    const under = projectMisstatement({
      method: "ratio",
      sample: [{ bookValue: 1000, auditedValue: 1100 }],
      remainderBookValue: 50000,
      remainderItemCount: 100,
    });
    expect(under.projectedMisstatement).toBe(-5000);
  });

  it("rounds the projection to the cent, half away from zero (exact in cents)", () => {
    // 1.00 ÷ 3 items × 10 items = 3.333… → 3.33; −1.00 ÷ 3 × 5 = −1.6666… → −1.67.
    expect(
      projectMisstatement({
        method: "difference",
        sample: [
          { bookValue: 1, auditedValue: 0 },
          { bookValue: 1, auditedValue: 1 },
          { bookValue: 1, auditedValue: 1 },
        ],
        remainderBookValue: 10,
        remainderItemCount: 10,
      }).projectedMisstatement,
    ).toBe(3.33);
    expect(
      projectMisstatement({
        method: "difference",
        sample: [
          { bookValue: 1, auditedValue: 2 },
          { bookValue: 1, auditedValue: 1 },
          { bookValue: 1, auditedValue: 1 },
        ],
        remainderBookValue: 5,
        remainderItemCount: 5,
      }).projectedMisstatement,
    ).toBe(-1.67);
  });

  it("stays exact for large ledgers (products beyond 2^53 cents)", () => {
    // Python 3.11 fractions: Fraction(123456) * Fraction(987654321098) / 10**8 / 100 → 12193185.1865… → 12,193,185.19.
    const r = projectMisstatement({
      method: "ratio",
      sample: [{ bookValue: 1000000, auditedValue: 998765.44 }],
      remainderBookValue: 9876543210.98,
      remainderItemCount: 1000000,
    });
    expect(r.projectedMisstatement).toBe(12193185.19);
  });

  it("refuses bad input naming the field", () => {
    expect(() =>
      projectMisstatement({ method: "ratio", sample: [], remainderBookValue: 1, remainderItemCount: 1 }),
    ).toThrow(/^sample must hold at least 1/);
    expect(() =>
      projectMisstatement({
        method: "ratio",
        sample: [{ bookValue: 0, auditedValue: -5 }],
        remainderBookValue: 1,
        remainderItemCount: 1,
      }),
    ).toThrow(/sampled book value is zero/);
    expect(() =>
      projectMisstatement({
        method: "mean" as "ratio",
        sample: items(1, 1, 0),
        remainderBookValue: 1,
        remainderItemCount: 1,
      }),
    ).toThrow(/^method must be one of/);
    expect(() =>
      projectMisstatement({
        method: "difference",
        sample: items(3, 1, 0),
        remainderBookValue: 1,
        remainderItemCount: 2,
      }),
    ).toThrow(/^remainderItemCount/);
    expect(() =>
      projectMisstatement({
        method: "difference",
        sample: items(1, 1, 0),
        remainderBookValue: 1.005,
        remainderItemCount: 2,
      }),
    ).toThrow(/^remainderBookValue must have at most 2 decimals/);
  });

  it("a sample that is the whole remainder projects exactly what it found (property)", () => {
    // common practice: with n = N the difference projection equals the sample's own misstatement.
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 1, max: 1e6 }), fc.integer({ min: 0, max: 1e6 })), {
          minLength: 1,
          maxLength: 40,
        }),
        (pairs) => {
          const sample = pairs.map(([b, a]) => ({ bookValue: b / 100, auditedValue: a / 100 }));
          const book = pairs.reduce((s, [b]) => s + b, 0) / 100;
          const diff = projectMisstatement({
            method: "difference",
            sample,
            remainderBookValue: book,
            remainderItemCount: sample.length,
          });
          const ratio = projectMisstatement({
            method: "ratio",
            sample,
            remainderBookValue: book,
            remainderItemCount: sample.length,
          });
          expect(diff.projectedMisstatement).toBeCloseTo(diff.sampleMisstatement, 8);
          expect(ratio.projectedMisstatement).toBeCloseTo(ratio.sampleMisstatement, 8);
        },
      ),
    );
  });
});
