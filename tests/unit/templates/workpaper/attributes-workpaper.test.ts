import { describe, expect, it } from "vitest";
import { attributesFixture } from "@/tests/support/workpaper";
import type { AttributesEvaluationBlock } from "@/templates/workpaper/workpaper-data";
import { expectCommonContent, expectDraftState } from "./expect-workpaper";
import { previewPngs, renderAndRead, squash } from "./pdf-support";

describe("attribute workpaper", () => {
  it("prints the deviations, the upper deviation limit and the tolerable rate", { timeout: 180_000 }, async () => {
    const data = attributesFixture({ draft: false });
    const pdf = await renderAndRead("attributes-locked", data);
    previewPngs(pdf.file, "attributes-locked");
    expectCommonContent(pdf, data);
    expectDraftState(pdf, false);
    const e = data.evaluation as AttributesEvaluationBlock;
    // AICPA Audit Guide "Audit Sampling" (2019), Table A-1: 5% risk, 5% tolerable, 1% expected → 93 (1).
    expect(e.sampleSize).toBe(93);
    expect(e.allowedDeviations).toBe(1);
    // Clopper–Pearson upper limit for 1 deviation in 93 at 95%: 0.04999 (beta(2, 92) quantile; the
    // Guide's evaluation table gives 5.0% for this cell).
    expect(e.upperDeviationLimit).toBeCloseTo(0.05, 3);
    const text = squash(pdf.text);
    expect(text).toMatch(/Upper deviation limit Beta⁻¹\(c; k\+1, n−k\) 5\.00%/);
    expect(text).toContain("Tolerable deviation rate TDR 5.00%");
    expect(text).toMatch(/Sample deviation rate k ?\/ ?n 1\.08%/);
    expect(text).toContain("No budget-holder approval before payment");
    expect(text).toContain("Nature of deviation and comment");
    expect(text).toContain("No review notes were raised.");
  });
});
