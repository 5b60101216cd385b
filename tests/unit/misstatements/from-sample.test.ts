import { describe, expect, it } from "vitest";
import { evaluateMus } from "@/lib/sampling";
import { concludedMisstatementOf, contributionOf, CONTRIBUTION_READERS } from "@/lib/misstatements/from-sample";
import { aggregate } from "@/lib/misstatements/aggregate";
import { sampleRows } from "@/lib/misstatements/rows";
import type { SampleRecord } from "@/lib/data/samples";
import type { SampleEvaluation } from "@/lib/samples/evaluate";
import type { MusEvaluationBlock } from "@/lib/samples/evaluation-types";

const sample = {
  id: 3,
  name: "Receivables",
  assertion: "Existence",
  direction: "overstatement",
  method: "mus",
  params: { confidence: 0.95 },
} as unknown as SampleRecord;

function musEvaluation(): SampleEvaluation {
  // AICPA Audit Guide "Audit Sampling" Stringer example as quoted in the engine's docblock (from memory for the
  // presentation): J = 21,920, 95 %, table factors, one item 5,480 audited at 4,384 → basic precision 65,760,
  // projected 4,384, incremental allowance 3,288, upper limit 73,432.
  const r = evaluateMus({
    interval: 21920,
    confidence: 0.95,
    sample: [{ bookValue: 5480, auditedValue: 4384 }],
    factors: "table",
  });
  const side = (x: typeof r.overstatement) => ({
    upperLimit: x.upperLimit.toFixed(2),
    projected: x.projected.toFixed(2),
  });
  const block = {
    method: "mus",
    direction: "overstatement",
    overstatement: side(r.overstatement),
    understatement: side(r.understatement),
  } as unknown as MusEvaluationBlock;
  return {
    sampleId: 3,
    method: "mus",
    direction: "overstatement",
    confidence: 0.95,
    tolerableMisstatement: "100000.00",
    complete: true,
    caution: "",
    notes: [],
    unauditableOnRow: "",
    warnings: [],
    progress: {
      total: 1,
      done: 1,
      notAuditable: 0,
      notStarted: 0,
      void: 0,
      misstatements: 1,
      misstatementTotal: "1096.00",
      deviations: 0,
    },
    block,
    computed: { statement: "" } as unknown as SampleEvaluation["computed"],
    projectedMisstatement: r.mostLikelyMisstatement.toFixed(2),
  };
}

describe("what a sample carries to the summary (the adapter over the evaluation)", () => {
  it("reads a monetary-unit sample: factual, projected beyond the items examined, allowance = upper limit − projected", () => {
    const c = contributionOf(sample, "Trade receivables", musEvaluation(), null);
    expect(c).toMatchObject({
      state: "contributes",
      factual: "1096.00",
      projectedTotal: "4384.00",
      allowance: "69048.00",
      upperLimit: "73432.00",
    }); // 73,432 − 4,384
    const [factual, projected] = sampleRows(c, [], 1, false);
    expect(factual.amount).toBe("1096.00"); // 5,480 − 4,384
    expect(projected.amount).toBe("3288.00"); // 4,384 − 1,096: the projection beyond the item examined
    expect(projected.allowance).toBe("69048.00");
  });

  it("lists a sample without results, and a test of controls, without rows", () => {
    const none = {
      ...musEvaluation(),
      block: null,
      projectedMisstatement: null,
      progress: { ...musEvaluation().progress, done: 0 },
    };
    expect(contributionOf(sample, "R", none, null)).toMatchObject({
      state: "no-results",
      reason: "No results recorded yet.",
    });
    const controls = {
      ...musEvaluation(),
      block: { method: "attributes" } as unknown as SampleEvaluation["block"],
      projectedMisstatement: null,
    };
    expect(contributionOf({ ...sample, method: "attribute" }, "R", controls, null).state).toBe("not-monetary");
  });

  it("takes a new kind of evaluation through one reader: a projection with no allowance says so on its row", () => {
    CONTRIBUTION_READERS["test-kind"] = () => ({
      allowance: null,
      allowanceNote: "Nonstatistical: no allowance for sampling risk is measured.",
      upperLimit: null,
      basis: "nonstatistical",
    });
    const ev = {
      ...musEvaluation(),
      block: { method: "test-kind" } as unknown as SampleEvaluation["block"],
      projectedMisstatement: "2500.00",
    };
    const [, projected] = sampleRows(contributionOf(sample, "R", ev, null), [], 1, false);
    expect(projected).toMatchObject({
      amount: "1404.00",
      allowance: null,
      allowanceNote: "Nonstatistical: no allowance for sampling risk is measured.",
    });
    delete CONTRIBUTION_READERS["test-kind"];
  });

  it("carries the auditor's 'conclude the amount is misstated' beyond the projection as a judgemental row, so the sample's rows add up to it", () => {
    const conclusion = {
      sampleId: 3,
      conclusion: "The upper limit exceeds tolerable misstatement; we conclude receivables are overstated.",
      responses: [
        { kind: "extend" as const, amount: null, note: null },
        { kind: "conclude-misstated" as const, amount: "9000.00", note: null },
      ],
      writtenBy: { id: 1, name: "Ines Senior", role: "senior" },
      writtenAt: "2026-12-03T10:00:00.000Z",
    };
    const concluded = concludedMisstatementOf(conclusion);
    expect(concludedMisstatementOf({ ...conclusion, responses: [] })).toBeNull();
    const rows = sampleRows(contributionOf(sample, "R", musEvaluation(), null, concluded), [], 1, false);
    expect(rows.map((r) => r.kind)).toEqual(["factual", "projected", "judgemental"]);
    expect(rows[2]).toMatchObject({ amount: "4616.00", allowance: null }); // 9,000 concluded − 4,384 projected (the Stringer example's projection)
    const { totals } = aggregate(rows, {
      overall: "50000.00",
      performance: "37500.00",
      clearlyTrivial: "500.00",
      approachingShare: 0.75,
      currency: "EUR",
    });
    expect(totals.uncorrected.currentYear).toBe("9000.00"); // factual + projected beyond + concluded beyond = the concluded amount
  });
});
