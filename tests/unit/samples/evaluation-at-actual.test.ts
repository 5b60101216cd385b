import { describe, expect, it } from "vitest";
import {
  buildStratifiedEvaluation,
  buildVariablesEvaluation,
  type EvaluatedItem,
} from "@/lib/samples/evaluation-blocks";

const item = (book: number, audited: number, reference = "x"): EvaluatedItem => ({
  reference,
  bookValue: book.toFixed(2),
  auditedValue: audited.toFixed(2),
});
/** 50 items of 1,000 drawn from 1,000 items (PCAOB AS 2315.26's example), $3,000 of overstatement on the first. */
const fifty = () => Array.from({ length: 50 }, (_, i) => item(1000, i === 0 ? -2000 : 1000, `S${i}`));
const plan = {
  direction: "overstatement",
  riskOfIncorrectRejection: 0.1,
  plannedAllowance: 40000,
  plannedSides: "one",
  distribution: "z",
  confidence: 0.95,
  sides: "lower",
  tolerableMisstatement: "50000.00",
} as const;

describe("key items and accepted anomalies at actual in a classical evaluation", () => {
  it("AS 2315.26: the remainder's projection plus the misstatement of the items examined 100 percent", () => {
    // PCAOB AS 2315.26: $3,000 in 50 of 1,000 items projects $60,000 (the difference estimator N·d̄ gives the same);
    // "the auditor should add that projection to the misstatements discovered in any items examined 100 percent".
    const remainderOnly = buildVariablesEvaluation({
      ...plan,
      estimator: "difference",
      populationSize: 1000,
      populationBookValue: "1000000.00",
      items: fifty(),
    });
    expect(remainderOnly.projectedMisstatement).toBe("60000.00");
    expect(remainderOnly.atActual).toBeNull();
    const b = buildVariablesEvaluation({
      ...plan,
      estimator: "difference",
      populationSize: 1000,
      populationBookValue: "1000000.00",
      items: fifty(),
      atActual: { keyItems: [item(200000, 199000)], anomalies: [] },
    });
    expect(b.projectedMisstatement).toBe("61000.00");
    expect(b.populationBookValue).toBe("1200000.00");
    expect(b.populationSize).toBe(1001);
    expect(b.estimatedAuditedValue).toBe("1139000.00"); // 940,000 on the remainder + 199,000 audited key item
    expect(b.standardError).toBe(remainderOnly.standardError); // items at actual carry no sampling error
    // The limit moves with the estimate: the allowance and the distance to X are unchanged by an error-free key item.
    expect(Number(b.decision.upperLimit) - Number(remainderOnly.decision.upperLimit)).toBeCloseTo(199000, 2); // overstatement: X against Ŷ + allowance
    expect(Number(b.decision.beyondLimit)).toBeCloseTo(Number(remainderOnly.decision.beyondLimit) + 1000, 2);
    expect(b.atActual).toMatchObject({
      remainderSize: 1000,
      remainderBookValue: "1000000.00",
      remainderProjectedMisstatement: "60000.00",
      keyItems: { count: 1, misstatement: "1000.00" },
    });
  });

  it("ISA 530 ¶13: an accepted anomaly enters the estimator unmisstated and is added at its actual amount", () => {
    const sample = fifty();
    sample[0] = { ...sample[0], auditedValue: sample[0].bookValue }; // the caller passes the anomaly as unmisstated
    const b = buildVariablesEvaluation({
      ...plan,
      estimator: "difference",
      populationSize: 1000,
      populationBookValue: "1000000.00",
      items: sample,
      atActual: { keyItems: [], anomalies: [item(1000, -2000)] },
    });
    expect(b.projectedMisstatement).toBe("3000.00");
    expect(b.atActual?.anomalies).toEqual({ count: 1, misstatement: "3000.00" });
    expect(b.populationBookValue).toBe("1000000.00");
  });

  it("stratified: the strata cover the remainder, X and N include the key items", () => {
    const strata = [
      { label: "low", populationSize: 500, populationBookValue: "500000.00", items: fifty().slice(0, 25) },
      { label: "high", populationSize: 500, populationBookValue: "500000.00", items: fifty().slice(25) },
    ];
    const b = buildStratifiedEvaluation({
      ...plan,
      estimator: "difference",
      strata,
      atActual: { keyItems: [item(5000, 4000)], anomalies: [] },
    });
    expect(b.populationBookValue).toBe("1005000.00");
    expect(b.populationSize).toBe(1001);
    expect(Number(b.projectedMisstatement) - Number(b.atActual!.remainderProjectedMisstatement)).toBeCloseTo(1000, 2);
  });
});
