import { describe, expect, it } from "vitest";
import { resolveKeyItems } from "@/lib/samples/key-items";
import { computeSelection } from "@/lib/samples/select";
import { riskSizing } from "@/lib/samples/risk-sizing";
import type { Frame } from "@/lib/samples/population-frame";
import { createRng } from "@/lib/sampling";
import { DEFAULT_METHODOLOGY } from "@/lib/validation/methodology";
import type { SampleParams } from "@/lib/validation/sample";

const values = [1250, 480.5, 0, 3625.75, 910.2, 12500, 155, -420, 2300.1, 777.77];
const frame: Frame = {
  populationId: 1,
  rowNumbers: Int32Array.from(values, (_, i) => i + 2),
  itemRefs: values.map((_, i) => `INV${String(i + 1).padStart(3, "0")}`),
  bookValues: values,
  bookCents: values.map((v) => BigInt(Math.round(v * 100))),
  totalCents: BigInt(Math.round(values.reduce((a, b) => a + b, 0) * 100)),
};
const params = (p: Partial<SampleParams>) =>
  ({
    method: "nonstatistical",
    confidence: 0.95,
    expectedMisstatement: "0.00",
    riskOfIncorrectRejection: 0.1,
    expectedRate: 0,
    factorMode: "exact",
    ...p,
  }) as SampleParams;

describe("key items", () => {
  it("takes every item at or above the threshold and the chosen ones with their reasons, in population order", () => {
    const k = resolveKeyItems(
      frame,
      params({ keyItemThreshold: "3000.00", keyItems: [{ itemRef: "INV009", reason: "Related party" }] }),
    )!;
    expect(k.items.map((i) => [i.itemRef, i.basis, i.reason])).toEqual([
      ["INV004", "threshold", null],
      ["INV006", "threshold", null],
      ["INV009", "chosen", "Related party"],
    ]);
    expect(k.total).toBe("18425.85");
    expect(k.remainder).toEqual({ count: 7, total: String((values.reduce((a, b) => a + b, 0) - 18425.85).toFixed(2)) });
  });

  it("refuses an unknown reference and a plan that leaves nothing to sample, naming the field", () => {
    expect(() => resolveKeyItems(frame, params({ keyItems: [{ itemRef: "X", reason: "typo" }] }))).toThrow(
      /keyItems\.0\.itemRef: No item X/,
    );
    expect(() =>
      resolveKeyItems(
        frame,
        params({
          keyItemThreshold: "0.01",
          keyItems: [
            { itemRef: "INV003", reason: "zero" },
            { itemRef: "INV008", reason: "credit" },
          ],
        }),
      ),
    ).toThrow(/nothing is left to sample/);
  });

  it("draws key items first, then the random-number sort over the remainder frame (SAMPLING-ENGINE §2)", () => {
    const picks = computeSelection(frame, { method: "random", frameSize: 8, ranks: 3, keyRows: [5, 7] }, 5489);
    expect(picks.slice(0, 2).map((p) => [p.position, p.keyItem, p.order])).toEqual([
      [3, true, 1],
      [5, true, 2],
    ]);
    const remainder = [0, 1, 2, 4, 6, 7, 8, 9];
    const rng = createRng(5489);
    const expected = remainder
      .map((position) => ({ position, u: rng.nextDouble() }))
      .sort((a, b) => a.u - b.u)
      .slice(0, 3)
      .map((x) => x.position);
    expect(picks.slice(2).map((p) => p.position)).toEqual(expected);
    expect(picks.slice(2).map((p) => p.order)).toEqual([3, 4, 5]);
  });

  it("a haphazard draw selects only the key items", () => {
    expect(
      computeSelection(frame, { method: "nonstatistical", frameSize: 10, selection: "haphazard", keyRows: [7] }, 0).map(
        (p) => p.position,
      ),
    ).toEqual([5]);
  });
});

describe("riskSizing", () => {
  it("maps the two risks through the firm's table, and a typed override to −ln(1 − c)", () => {
    const table = { version: 3, assuranceFactors: DEFAULT_METHODOLOGY.assuranceFactors };
    // Shipped defaults (from memory): low × low → 1.0; confidence 1 − e^(−1) = 0.6321 (common practice).
    expect(
      riskSizing(params({ sizingBasis: "risk-assessment", assessedRisk: "low", otherProceduresRisk: "low" }), table),
    ).toMatchObject({ factor: 1, confidence: 0.6321, tableVersion: 3, basis: "risk-assessment" });
    // −ln(1 − 0.90) = 2.302585 (common practice: 2.3 ≈ 90 %).
    const typed = riskSizing(
      params({ sizingBasis: "confidence-override", confidence: 0.9, confidenceReason: "Group instruction" }),
      table,
    );
    expect(typed.factor).toBeCloseTo(2.3026, 4);
    expect(typed.overrideReason).toBe("Group instruction");
    expect(riskSizing(params({ confidence: 0.95 }), table)).toMatchObject({
      basis: "typed-confidence",
      confidence: 0.95,
      assessedRisk: null,
    });
  });
});
