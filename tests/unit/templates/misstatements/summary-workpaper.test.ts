import fs from "node:fs";
import { describe, expect, it } from "vitest";
import { aggregate } from "@/lib/misstatements/aggregate";
import { entryRow, sampleRows } from "@/lib/misstatements/rows";
import type { SummaryView } from "@/lib/misstatements/types";
import { renderSummaryWorkpaper } from "@/templates/misstatements/render-summary";
import { pageCount, previewPngs } from "../workpaper/pdf-support";
import { execFileSync } from "node:child_process";
import os from "node:os";
import path from "node:path";

// The worked example of tests/unit/misstatements/aggregate.test.ts, reduced (figures invented): the
// PDF must print the view model's own figures, both approaches apart, and the allowance caveat.
const m = {
  overall: "100000.00",
  performance: "75000.00",
  clearlyTrivial: "2000.00",
  approachingShare: 0.75,
  currency: "USD",
};
const contribution = {
  sampleId: 1,
  name: "Receivables existence",
  account: "Trade receivables",
  assertion: "Existence",
  direction: "overstatement",
  method: "mus",
  state: "contributes" as const,
  reason: null,
  factual: "3000.00",
  projectedTotal: "30500.00",
  allowance: "41250.00",
  allowanceNote: null,
  upperLimit: null,
  confidence: 0.95,
  basis: "monetary-unit (Stringer bound)",
  complete: true,
  lockedAt: null,
};
const rows = [
  ...sampleRows(contribution, [], 7, false),
  entryRow(
    {
      id: 2,
      kind: "judgemental",
      account: "Warranty provision",
      assertion: "Valuation",
      description: "Provision understated",
      amount: "12000.00",
      incomeEffect: "12000.00",
      balanceEffect: "12000.00",
      corrected: null,
      evidenceCount: 1,
    },
    7,
  ),
  entryRow(
    {
      id: 4,
      kind: "prior-period",
      account: "Revenue",
      assertion: "Cut-off",
      description: "Prior-year cut-off reversed this year",
      amount: "9000.00",
      incomeEffect: "-9000.00",
      balanceEffect: "0.00",
      corrected: null,
      evidenceCount: 0,
    },
    7,
  ),
];

function view(): SummaryView {
  return {
    engagement: {
      id: 7,
      clientName: "Tessaly Outdoor Supply Inc.",
      name: "Financial statement audit FY2026",
      periodEnd: "2026-09-30",
      currency: "USD",
    },
    firmName: "Marrow & Quill Assurance LLP",
    workpaperReference: "WP-7-MIS",
    generatedAt: "2026-12-03T08:00:00.000Z",
    materiality: m,
    ...aggregate(rows, m),
    samples: [
      {
        sampleId: 1,
        reference: "S001",
        name: "Receivables existence",
        link: "/engagements/7/samples/1",
        method: "mus",
        state: "contributes",
        reason: null,
        locked: false,
        frozen: false,
      },
    ],
    entries: [],
    review: {
      preparer: null,
      reviewer: null,
      staleSignOffs: false,
      lock: null,
      openNotes: 0,
      reviewerBlocker: "The preparer (staff or senior) signs off the summary first; the reviewer signs after.",
      lockable: { ok: false, reasons: [] },
    },
    notes: [],
    trail: [
      {
        at: "2026-12-03T07:59:00.000Z",
        who: "Jonah Lindqvist",
        action: "create",
        subject: "entry 2",
        before: null,
        after: '{"amount":"12000.00"}',
      },
    ],
    rowsSha256: "",
    conventions: ["Amounts are exact to the cent."],
    caution: "These figures support, and do not replace, the auditor's professional judgement.",
  };
}

describe("the summary of misstatements workpaper", () => {
  it("prints the totals, the two approaches apart, the status and the allowance caveat, watermarked as a draft", async () => {
    const bytes = await renderSummaryWorkpaper(view(), { draft: true });
    const file = path.join(os.tmpdir(), "sondage-summary-workpaper.pdf");
    fs.writeFileSync(file, bytes);
    const flat = execFileSync("pdftotext", [file, "-"], { encoding: "utf8" }).replace(/\s+/g, " ");
    // current year 3,000.00 + 27,500.00 + 12,000.00 = 42,500.00; IS 42,500.00 − 9,000.00 = 33,500.00; BS 42,500.00 + 0.00
    expect(flat).toContain("42,500.00");
    expect(flat).toContain("33,500.00");
    expect(flat).toMatch(/Income statement \(rollover\)/);
    expect(flat).toMatch(/Balance sheet \(iron curtain\)/);
    expect(flat).toMatch(/do not add linearly/);
    expect(flat).toContain("Well within materiality");
    expect(flat).toContain("DRAFT");
    expect(flat).toContain("WP-7-MIS");
    expect(flat).toContain("Audit trail of the summary");
    expect(pageCount(file)).toBe(3);
    expect(previewPngs(file, "summary-of-misstatements").length).toBe(3);
  });
});
