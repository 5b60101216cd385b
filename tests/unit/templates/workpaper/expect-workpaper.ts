/** Checks every workpaper must pass, whatever its method. */
import { expect } from "vitest";
import { CAUTION, DRAFT_MARK } from "@/templates/workpaper/page-frame";
import type { WorkpaperData } from "@/templates/workpaper/workpaper-data";
import { squash, watermarkPixels, type RenderedPdf } from "./pdf-support";
import { formatMoney } from "@/lib/format/number";

export const SECTION_TITLES = [
  "1 Objective and assertion",
  "2 Population",
  "3 Method and sample size",
  "4 Selection",
  "5 Results",
  "6 Evaluation",
  "7 Result and conclusion",
  "8 Review notes",
  "9 Sign-offs",
  "A Appendix — audit trail",
];

export function expectCommonContent(pdf: RenderedPdf, data: WorkpaperData): void {
  const text = squash(pdf.text);
  for (const title of SECTION_TITLES) expect(text).toContain(title);
  for (const fact of [data.firmName, data.clientName, data.workpaperReference, "period ended 31 Dec 2026"])
    expect(text).toContain(fact);
  expect(text).toContain(String(data.selection.seed));
  expect(text).toContain(data.population.sha256);
  expect(text).toContain(data.selection.selectionSha256);
  expect(text).toContain(data.selection.algorithm);
  expect(text).toContain(formatMoney(data.population.total));
  // The recipe is printed verbatim, line by line.
  expect(pdf.flat).toContain(`rs = np.random.RandomState(${data.selection.seed})`);
  for (const item of data.items.slice(0, 5)) {
    expect(text).toContain(item.reference);
    expect(text).toContain(formatMoney(item.bookValue));
  }
  for (const row of data.auditTrail) expect(pdf.flat).toContain(row.action);
  // Page x of y on every page, in order.
  expect(pdf.pages).toHaveLength(pdf.pageCount);
  pdf.pages.forEach((page, i) => {
    expect(page).toContain(`Page ${i + 1} of ${pdf.pageCount}`);
    expect(squash(page)).toContain("These results support, and do not replace");
  });
  // The caution in full, on the conclusion page as well as in every footer.
  expect(pdf.flat).toContain(CAUTION);
  const conclusionPage = pdf.pages.find((p) => squash(p).includes("7 Result and conclusion"))!;
  expect(conclusionPage.replace(/\s+/g, " ")).toContain("CAUTION");
  // Issue 13 §6: the computed result, labelled as Sondage's with its rule, apart from the auditor's conclusion (who, when).
  expect(text).toContain("Computed by Sondage");
  expect(squash(data.conclusion.computed.statement).length).toBeGreaterThan(0);
  expect(text).toContain(squash(data.conclusion.computed.statement));
  if (data.conclusion.auditor)
    expect(text).toContain(`Written by ${data.conclusion.auditor.writtenBy} (${data.conclusion.auditor.role})`);
}

export function expectDraftState(pdf: RenderedPdf, draft: boolean): void {
  // The banner is text on every page; the diagonal watermark is a shape, found by its pixels.
  pdf.pages.forEach((page, i) => {
    const marks = page.split(DRAFT_MARK).length - 1;
    if (draft) expect(marks).toBe(1);
    else expect(marks).toBe(0);
    if (i === 0 || i === pdf.pages.length - 1) {
      if (draft) expect(watermarkPixels(pdf.file, i + 1)).toBeGreaterThan(200);
      else expect(watermarkPixels(pdf.file, i + 1)).toBe(0);
    }
  });
  if (!draft) {
    expect(pdf.text).not.toMatch(/DRAFT/);
    expect(pdf.flat).toContain("Locked by");
  }
}
