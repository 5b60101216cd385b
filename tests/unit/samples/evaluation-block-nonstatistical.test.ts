import { describe, expect, it } from "vitest";
import {
  buildNonstatisticalEvaluation,
  NONSTATISTICAL_RESPONSES,
  type NonstatisticalItem,
} from "@/lib/samples/evaluation-block-nonstatistical";
import { computedResultOf } from "@/lib/samples/computed-result";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { NonstatisticalResult } from "@/components/samples/nonstatistical-result";
import { DIRECTION_LABELS } from "@/lib/validation/sample";

/**
 * PCAOB AS 2315.26's example: every twentieth item (50) of 1,000 items; TM $50,000 on a $1 million
 * balance. Items of 1,000 each here, so the ratio and difference projections agree (50,000 sampled of 1,000,000).
 */
function evaluate(sample: NonstatisticalItem[], o: Partial<Parameters<typeof buildNonstatisticalEvaluation>[0]> = {}) {
  return buildNonstatisticalEvaluation({
    projection: "difference",
    direction: "overstatement",
    sample,
    keyItems: [],
    keyItemsPlanned: 0,
    remainder: { count: 1000, bookValue: "1000000.00" },
    tolerableMisstatement: "50000.00",
    expectedMisstatement: "0.00",
    wellBelow: { basis: "share-of-tolerable", share: 0.5, amount: "25000.00" },
    haphazard: false,
    ...o,
  });
}
const item = (book: number, audited: number, anomaly = false): NonstatisticalItem => ({
  bookValue: book.toFixed(2),
  auditedValue: audited.toFixed(2),
  anomaly,
});
/** 50 items of 1,000 with the given overstatements on the first ones. */
const fifty = (over: number[]) => Array.from({ length: 50 }, (_, i) => item(1000, 1000 - (over[i] ?? 0)));
const progress = { total: 50, done: 50, notAuditable: 0 };

describe("buildNonstatisticalEvaluation", () => {
  it("AS 2315.26: $3,000 of overstatement in 50 of 1,000 items projects $60,000, which exceeds TM $50,000", () => {
    // PCAOB AS 2315.26: "a sample of every twentieth item (50 items) from a population containing one thousand
    // items … overstatements of $3,000 … project a $60,000 overstatement".
    const b = evaluate(fifty([3000]));
    expect(b.projectedMisstatement).toBe("60000.00");
    expect(b.verdict).toBe("exceeds");
    expect(b.supported).toBe(false);
    expect(b.statement).toMatch(/sampling risk is unacceptably high/);
    expect(b.responses).toEqual(NONSTATISTICAL_RESPONSES);
    expect(computedResultOf({ block: b, progress, complete: true })).toMatchObject({
      status: "not-supported",
      supported: false,
      responseNeeded: true,
    });
  });

  it("AS 2315.26: the ratio method gives the same $60,000 when every item has the same book value", () => {
    expect(evaluate(fifty([3000]), { projection: "ratio" }).projectedMisstatement).toBe("60000.00");
  });

  it("AS 2315.26: TM $50,000 on $1 million with a total projection of $10,000 — acceptably low risk (well below at half of TM, firm setting)", () => {
    // PCAOB AS 2315.26: "if the tolerable misstatement in an account balance of $1 million is $50,000 and the total
    // projected misstatement … is $10,000, he may be reasonably assured that there is an acceptably low sampling risk".
    const b = evaluate(fifty([500]));
    expect(b.totalProjected).toBe("10000.00");
    expect(b.verdict).toBe("supports");
    expect(b.responses).toEqual([]);
    expect(computedResultOf({ block: b, progress, complete: true })).toMatchObject({
      status: "supported",
      supported: true,
      responseNeeded: false,
    });
  });

  it("AS 2315.26: a total close to TM — an unacceptably high risk, not supported", () => {
    // PCAOB AS 2315.26: "if the total projected misstatement is close to the tolerable misstatement, the auditor may
    // conclude that there is an unacceptably high risk that the actual misstatements in the population exceed the tolerable misstatement".
    const b = evaluate(fifty([2250])); // 45,000
    expect(b.verdict).toBe("approaches");
    expect(b.supported).toBe(false);
    expect(b.statement).toMatch(/not well below it/);
    expect(computedResultOf({ block: b, progress, complete: true }).statement).toMatch(
      /does not support the recorded amount — a nonstatistical evaluation, which claims no confidence level: the total projected misstatement is below tolerable misstatement but not well below it/,
    );
  });

  it("the default rule compares the total with the expected misstatement used in planning", () => {
    // AICPA Audit Guide "Audit Sampling", nonstatistical evaluation (from memory): a total below the expected
    // misstatement used in planning generally gives an acceptably low sampling risk.
    const em = (amount: string) => ({
      expectedMisstatement: amount,
      wellBelow: { basis: "expected-misstatement" as const, share: 0.5, amount },
    });
    expect(evaluate(fifty([500]), em("12000.00")).verdict).toBe("supports");
    expect(evaluate(fifty([500]), em("8000.00")).verdict).toBe("approaches");
    expect(evaluate(fifty([500]), em("8000.00")).wellBelowBasis).toBe(
      "the expected misstatement used in planning, 8,000.00",
    );
  });

  it("adds key items at actual and takes an accepted anomaly out of the projection (ISA 530 ¶13, AS 2315.26)", () => {
    const sample = fifty([500]);
    sample[0] = item(1000, 500, true);
    const b = evaluate(sample, {
      keyItems: [item(200000, 199000)],
      keyItemsPlanned: 2,
      remainder: { count: 1000, bookValue: "1000000.00" },
    });
    expect(b.projectedMisstatement).toBe("0.00");
    expect(b.anomalies).toEqual({ count: 1, misstatement: "500.00" });
    expect(b.keyItems).toEqual({ planned: 2, evaluated: 1, misstatement: "1000.00" });
    expect(b.totalProjected).toBe("1500.00");
    expect(b.warnings).toContain("1 key item has no result yet; key items are examined in full.");
    // Not an accepted anomaly: projected like any other misstatement (10,000 + 1,000).
    sample[0] = item(1000, 500, false);
    expect(evaluate(sample, { keyItems: [item(200000, 199000)] }).totalProjected).toBe("11000.00");
  });

  it("an understatement test compares the understated total", () => {
    const under = Array.from({ length: 50 }, (_, i) => item(1000, i === 0 ? 4000 : 1000));
    const b = evaluate(under, { direction: "understatement" });
    expect(b.totalProjected).toBe("-60000.00");
    expect(b.comparedAmount).toBe("60000.00");
    expect(b.verdict).toBe("exceeds");
  });

  it("only key items with results: no projection yet, key items at actual", () => {
    const b = evaluate([], { keyItems: [item(5000, 4000)], keyItemsPlanned: 1 });
    expect(b.projectedMisstatement).toBe("0.00");
    expect(b.totalProjected).toBe("1000.00");
  });

  it("a haphazard selection says it cannot be re-performed, and no bound is ever claimed", () => {
    const b = evaluate(fifty([]), { haphazard: true });
    expect(b.warnings.join(" ")).toMatch(/no statistical bound/);
    expect(b.warnings.join(" ")).toMatch(/cannot be re-performed from a seed/);
  });
});

describe("the nonstatistical result on screen (issue 19: labels, never codes)", () => {
  it("names the direction compared with TM in the product's words", () => {
    const under = Array.from({ length: 50 }, (_, i) => item(1000, i === 0 ? 4000 : 1000));
    const html = renderToStaticMarkup(
      createElement(NonstatisticalResult, { n: evaluate(under, { direction: "understatement" }) }),
    );
    expect(html).toContain(
      `Compared with tolerable misstatement (${DIRECTION_LABELS.understatement.toLowerCase()} tested)`,
    );
    expect(html).not.toContain("(understatement)");
  });
});
