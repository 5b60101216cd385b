import { describe, expect, it } from "vitest";
import { evaluateNonstatistical } from "@/lib/samples/evaluate-nonstatistical";
import type { SampleRecord } from "@/lib/data/samples";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import { DEFAULT_METHODOLOGY } from "@/lib/validation/methodology";

/** A nonstatistical sample of 50 items drawn from 1,000 (PCAOB AS 2315.26's example), TM 50,000 on a $1 million balance. */
function sample(
  o: {
    projection?: "ratio" | "difference";
    basis?: "expected-misstatement" | "share-of-tolerable";
    expected?: number;
    direction?: SampleRecord["direction"];
  } = {},
): SampleRecord {
  const basis = o.basis ?? "share-of-tolerable";
  const expected = o.expected ?? 0;
  return {
    id: 1,
    engagementId: 1,
    populationId: 1,
    name: "t",
    objective: "t",
    assertion: "Existence",
    direction: o.direction ?? "overstatement",
    method: "nonstatistical",
    estimator: null,
    params: {} as SampleRecord["params"],
    computedSize: 50,
    chosenSize: 50,
    sizeReason: null,
    status: "drawn",
    planVersion: 1,
    createdAt: "",
    createdByName: "",
    methodology: DEFAULT_METHODOLOGY,
    methodologyVersion: 0,
    plan: {
      method: "nonstatistical",
      frameSize: 1000,
      frameTotal: "1000000.00",
      excluded: null,
      computedSize: 50,
      chosenSize: 50,
      formula: "",
      inputs: {},
      warnings: [],
      nonstatistical: {
        selection: "systematic",
        projection: o.projection ?? "difference",
        assuranceFactor: 3,
        expectedMisstatement: expected.toFixed(2),
        expectedMisstatementAdjustment: "none",
        minimumSampleSize: 0,
        raisedToMinimum: false,
        wellBelow: { basis, share: 0.5, amount: (basis === "expected-misstatement" ? expected : 25000).toFixed(2) },
      },
    },
  };
}

let nextId = 1;
function item(book: number, audited: number, extra: Partial<SampleItemRecord> = {}): SampleItemRecord {
  return {
    id: nextId++,
    selectionOrder: nextId,
    populationRowNumber: nextId,
    itemRef: `I${nextId}`,
    description: null,
    bookValue: book.toFixed(2),
    hitPoints: null,
    topStratum: false,
    stratum: null,
    origin: "selection",
    replacesItemId: null,
    status: "done",
    auditedValue: audited.toFixed(2),
    misstatement: (book - audited).toFixed(2),
    cause: null,
    causeNote: null,
    deviation: null,
    deviationNature: null,
    comment: null,
    voidReason: null,
    evidenceCount: 0,
    requestStatus: null,
    version: 1,
    updatedAt: null,
    updatedByName: null,
    keyItem: false,
    keyReason: null,
    pickedByName: null,
    pickedAt: null,
    anomaly: null,
    ...extra,
  };
}
const fifty = (over: number[]) => Array.from({ length: 50 }, (_, i) => item(1000, 1000 - (over[i] ?? 0)));

describe("evaluateNonstatistical", () => {
  it("AS 2315.26: $3,000 of overstatement in 50 of 1,000 items projects $60,000, which exceeds TM $50,000", () => {
    // PCAOB AS 2315.26: every twentieth item (50) of 1,000, overstatements of $3,000 → projected $60,000.
    const r = evaluateNonstatistical(sample(), fifty([3000]), 50000, true);
    expect(r.evaluation.projectedMisstatement).toBe(60000);
    expect(r.evaluation.verdict).toBe("exceeds");
    expect(r.supported).toBe(false);
    expect(r.conclusion).toMatch(/sampling risk is unacceptably high/);
    expect(r.evaluation.responses).toContain(
      "Extend the test: examine more items from the remainder and evaluate again.",
    );
    expect(r.upperBound).toBeNull();
  });

  it("AS 2315.26: TM $50,000 on $1 million with a total projection of $10,000 — acceptably low risk (well below at half of TM, firm setting)", () => {
    // PCAOB AS 2315.26: "the tolerable misstatement ... is $50,000 and the total projected misstatement ... is $10,000".
    const r = evaluateNonstatistical(sample(), fifty([500]), 50000, true);
    expect(r.evaluation.totalProjected).toBe(10000);
    expect(r.evaluation.verdict).toBe("supports");
    expect(r.supported).toBe(true);
    expect(r.evaluation.responses).toEqual([]);
  });

  it("AS 2315.26: a total close to TM — the risk may be unacceptably high", () => {
    const r = evaluateNonstatistical(sample(), fifty([2250]), 50000, true); // 45,000
    expect(r.evaluation.verdict).toBe("approaches");
    expect(r.supported).toBeNull();
    expect(r.conclusion).toMatch(/may be unacceptably high/);
  });

  it("the Guide's default rule compares with the expected misstatement used in planning", () => {
    // common practice (AICPA Audit Guide, from memory): well below = at most the expected misstatement used in planning.
    expect(
      evaluateNonstatistical(sample({ basis: "expected-misstatement", expected: 12000 }), fifty([500]), 50000, true)
        .evaluation.verdict,
    ).toBe("supports");
    expect(
      evaluateNonstatistical(sample({ basis: "expected-misstatement", expected: 8000 }), fifty([500]), 50000, true)
        .evaluation.verdict,
    ).toBe("approaches");
  });

  it("adds key items at actual and takes an accepted anomaly out of the projection (ISA 530 ¶13)", () => {
    const items = [...fifty([500]), item(200000, 199000, { keyItem: true })];
    const accepted = {
      justification: "x".repeat(20),
      markedByName: "A",
      markedAt: "2026-12-03T08:00:00.000Z",
      acceptedByName: "M",
      acceptedAt: "2026-12-03T09:00:00.000Z",
    };
    items[0] = { ...items[0], anomaly: accepted };
    const r = evaluateNonstatistical(sample(), items, 50000, true);
    expect(r.evaluation.projectedMisstatement).toBe(0);
    expect(r.evaluation.anomalies).toEqual({ count: 1, misstatement: 500 });
    expect(r.evaluation.keyItems.misstatement).toBe(1000);
    expect(r.evaluation.totalProjected).toBe(1500);
    // Firm setting off, or not yet accepted: projected like any other misstatement (10,000 + 1,000).
    expect(evaluateNonstatistical(sample(), items, 50000, false).evaluation.totalProjected).toBe(11000);
    items[0] = { ...items[0], anomaly: { ...accepted, acceptedAt: null, acceptedByName: null } };
    expect(evaluateNonstatistical(sample(), items, 50000, true).evaluation.totalProjected).toBe(11000);
  });

  it("an understatement test compares the understated total", () => {
    const under = Array.from({ length: 50 }, (_, i) => item(1000, i === 0 ? 4000 : 1000));
    const r = evaluateNonstatistical(sample({ direction: "understatement" }), under, 50000, true);
    expect(r.evaluation.totalProjected).toBe(-60000);
    expect(r.evaluation.comparedAmount).toBe(60000);
    expect(r.evaluation.verdict).toBe("exceeds");
  });
});
