import { describe, expect, it } from "vitest";
import { stratifiedFixture } from "@/tests/support/workpaper";
import type { StratifiedEvaluationBlock } from "@/templates/workpaper/workpaper-data";
import { expectCommonContent, expectDraftState } from "./expect-workpaper";
import { previewPngs, renderAndRead, squash } from "./pdf-support";
import { formatMoney } from "@/lib/format/number";

describe("stratified workpaper", () => {
  it("prints a row per stratum and the combined ratio evaluation", { timeout: 180_000 }, async () => {
    const data = stratifiedFixture({ draft: true });
    const pdf = await renderAndRead("stratified-draft", data);
    previewPngs(pdf.file, "stratified-draft");
    expectCommonContent(pdf, data);
    expectDraftState(pdf, true);
    const e = data.evaluation as StratifiedEvaluationBlock;
    const text = squash(pdf.text);
    expect(e.strata).toHaveLength(3);
    for (const st of e.strata) {
      expect(text).toContain(st.label);
      expect(text).toContain(formatMoney(st.estimatedAuditedValue));
      expect(text).toContain(formatMoney(st.standardError));
    }
    // Independent strata: the total standard error is the root of the summed squares (Cochran 1977 §5.3).
    const combined = Math.sqrt(e.strata.reduce((sum, st) => sum + Number(st.standardError) ** 2, 0));
    expect(combined).toBeCloseTo(Number(e.standardError), 0);
    expect(text).toContain("Combined ratio (stratified)");
    expect(text).toContain(formatMoney(e.standardError));
    expect(text).toContain("conclusion and response");
    expect(text).toContain(formatMoney(e.decision.achievedAllowance));
  });
});
