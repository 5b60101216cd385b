import { describe, expect, it } from "vitest";
import { evaluateVariables } from "@/lib/sampling";
import { normalQuantile } from "@/lib/sampling/quantiles";
import { variablesFixture } from "@/tests/support/workpaper";
import type { VariablesEvaluationBlock } from "@/templates/workpaper/workpaper-data";
import { expectCommonContent, expectDraftState } from "./expect-workpaper";
import { previewPngs, renderAndRead, squash } from "./pdf-support";
import { formatMoney } from "@/lib/format/number";

const SLOW = { timeout: 180_000 };

describe("classical variables workpaper", () => {
  it("prints the difference-estimator evaluation with its formulas, watermarked as a draft", SLOW, async () => {
    const data = variablesFixture({ draft: true });
    const pdf = await renderAndRead("variables-draft", data);
    previewPngs(pdf.file, "variables-draft");
    expectCommonContent(pdf, data);
    expectDraftState(pdf, true);
    const e = data.evaluation as VariablesEvaluationBlock;
    // The printed figures are the engine's, re-computed here from the printed items.
    const direct = evaluateVariables({
      estimator: "difference",
      populationSize: e.populationSize,
      populationBookValue: Number(e.populationBookValue),
      sample: data.items.map((i) => ({ bookValue: Number(i.bookValue), auditedValue: Number(i.auditedValue) })),
      confidence: e.confidence,
      sides: e.sides,
    });
    expect(Number(e.standardError)).toBeCloseTo(direct.standardError, 2);
    // AICPA Audit Guide decision rule: A′ = z_α·SE with z_α two-sided at 1 − RIR/2 (both directions tested).
    expect(Number(e.decision.achievedAllowance)).toBeCloseTo(
      normalQuantile(1 - e.decision.riskOfIncorrectRejection / 2) * direct.standardError,
      2,
    );
    const text = squash(pdf.text);
    for (const amount of [
      e.estimatedAuditedValue,
      e.projectedMisstatement,
      e.standardError,
      e.decision.plannedAllowance,
      e.decision.achievedAllowance,
      e.decision.allowance,
      e.decision.lowerLimit!,
      e.decision.upperLimit!,
    ]) {
      expect(text).toContain(formatMoney(amount));
    }
    expect(text).toContain("Ŷ = X + N · d̄");
    expect(text).toContain("A′ z_α · SE");
    expect(pdf.flat).toContain("Cochran, Sampling Techniques, 3rd ed. (1977)");
    // Reconciliation difference and its explanation.
    expect(text).toContain("125.40");
    expect(pdf.flat).toContain("Goods-in-transit accrual");
  });

  it("breaks a 300-item results table across pages and repeats its header row", SLOW, async () => {
    const data = variablesFixture({ draft: false, sampleSize: 300 });
    expect(data.items).toHaveLength(300);
    const pdf = await renderAndRead("variables-300", data);
    expectDraftState(pdf, false);
    expect(pdf.pageCount).toBeGreaterThan(1);
    const resultPages = pdf.pages.filter((page) => /^\s*\d+\s+INV-\d{5}/m.test(page));
    expect(resultPages.length).toBeGreaterThan(3);
    for (const page of resultPages)
      expect(squash(page)).toContain("# Reference and description Book (EUR) Audited (EUR) Misstatement");
    // Every item is printed once, in selection order.
    const orders = pdf.pages.flatMap((page) => [...page.matchAll(/^\s*(\d+)\s+INV-\d{5}/gm)].map((m) => Number(m[1])));
    expect(orders).toEqual(Array.from({ length: 300 }, (_, i) => i + 1));
    expect(squash(pdf.text)).toContain("Raised to 300");
  });
});
