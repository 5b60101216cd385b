import { describe, expect, it } from "vitest";
import { evaluateMus } from "@/lib/sampling";
import { musFixture } from "@/tests/support/workpaper";
import type { MusEvaluationBlock } from "@/templates/workpaper/workpaper-data";
import { expectCommonContent, expectDraftState } from "./expect-workpaper";
import { previewPngs, renderAndRead, squash } from "./pdf-support";
import { formatMoney } from "@/lib/format/number";

const SLOW = { timeout: 180_000 };

describe("monetary-unit workpaper", () => {
  it("prints every section, the Stringer table and the lock, without the draft mark once locked", SLOW, async () => {
    const data = musFixture({ draft: false });
    const pdf = await renderAndRead("mus-locked", data);
    previewPngs(pdf.file, "mus-locked");
    expectCommonContent(pdf, data);
    expectDraftState(pdf, false);
    const e = data.evaluation as MusEvaluationBlock;
    const text = squash(pdf.text);
    expect(text).toContain("Upper misstatement limit");
    expect(text).toContain("Net upper misstatement limit");
    for (const amount of [
      e.overstatement.basicPrecision,
      e.overstatement.upperLimit,
      e.understatement.upperLimit,
      e.netUpperLimits.overstatement,
      e.mostLikelyMisstatement,
    ]) {
      expect(text).toContain(formatMoney(amount));
    }
    for (const row of e.overstatement.rows) expect(text).toContain(row.reference);
    expect(text).toContain(`Sampling interval (EUR) ${formatMoney(data.plan.interval)}`);
    expect(text).toContain("top stratum");
    expect(text).toContain("Tomas Reyne");
    expect(pdf.pageCount).toBeGreaterThan(3);
  });

  it("prints the engine's Stringer bound for the printed items, to the cent", SLOW, async () => {
    const data = musFixture({ draft: true });
    const e = data.evaluation as MusEvaluationBlock;
    // Re-evaluate from the printed items, independently of the fixture's builder.
    const sample = data.items
      .filter((i) => !i.topStratum)
      .map((i) => ({ bookValue: Number(i.bookValue), auditedValue: Number(i.auditedValue) }));
    const top = data.items
      .filter((i) => i.topStratum)
      .map((i) => ({ bookValue: Number(i.bookValue), auditedValue: Number(i.auditedValue) }));
    const direct = evaluateMus({
      interval: Number(e.interval),
      confidence: e.confidence,
      sample,
      topStratum: top,
      factors: e.factorMode,
    });
    expect(Number(e.overstatement.upperLimit)).toBeCloseTo(direct.overstatement.upperLimit, 2);
    expect(Number(e.netUpperLimits.understatement)).toBeCloseTo(direct.netUpperLimits.understatement, 2);
    // Basic precision: RF(0) = −ln(0.05) = 2.9957 at 95% (Poisson; the AICPA guide tabulates 3.0).
    expect(e.overstatement.basicPrecisionFactor).toBeCloseTo(2.995732, 6);
    // The ranked rows add up to the engine's totals (each row rounded to the cent).
    const rows = e.overstatement.rows;
    const projected = rows.reduce((sum, r) => sum + Number(r.projected), 0);
    expect(projected).toBeCloseTo(Number(e.overstatement.projectedFromSample), 1);
    for (let k = 1; k < rows.length; k++) expect(rows[k].tainting).toBeLessThanOrEqual(rows[k - 1].tainting);

    const pdf = await renderAndRead("mus-draft", data);
    previewPngs(pdf.file, "mus-draft");
    expectDraftState(pdf, true);
    expectCommonContent(pdf, data);
    expect(squash(pdf.text)).toContain(formatMoney(e.overstatement.upperLimit));
  });
});
