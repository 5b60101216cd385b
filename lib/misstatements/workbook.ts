import "server-only";
import ExcelJS from "exceljs";
import { safeCellText } from "@/lib/fieldwork/cell-text";
import { KIND_LABELS, treatmentOf } from "./labels";
import type { SummaryView } from "./types";
import { formatDate, formatDateTime } from "@/lib/format/date";

const MONEY_FORMAT = "#,##0.00;-#,##0.00";
const t = (v: string | null | undefined) => safeCellText(v ?? "");
const n = (v: string | null) => (v === null ? null : Number(v));

function writeOverview(wb: ExcelJS.Workbook, v: SummaryView) {
  const ws = wb.addWorksheet("Summary");
  ws.columns = [{ width: 52 }, { width: 22 }, { width: 22 }];
  const line = (label: string, value: string | number | null = null, money = false) => {
    const row = ws.addRow([t(label), typeof value === "string" && !money ? t(value) : value]);
    if (money) row.getCell(2).numFmt = MONEY_FORMAT;
    return row;
  };
  ws.addRow([t(`Summary of misstatements — ${v.engagement.clientName} · ${v.engagement.name}`)]).font = {
    bold: true,
    size: 13,
  };
  line("Period ended", formatDate(v.engagement.periodEnd));
  line(
    "Workpaper",
    `${v.workpaperReference}${v.review.lock ? ` (locked ${formatDateTime(v.review.lock.at)}, SHA-256 ${v.review.lock.workpaperSha256})` : " (draft, not locked)"}`,
  );
  line("Currency", v.materiality.currency);
  ws.addRow([]);
  line("Overall materiality", n(v.materiality.overall), true);
  line("Performance materiality", n(v.materiality.performance), true);
  line("Clearly trivial threshold", n(v.materiality.clearlyTrivial), true);
  line(
    `Approaching above this share of performance materiality (${v.status.approachingShareSource})`,
    `${Math.round(v.materiality.approachingShare * 10000) / 100} %`,
  );
  ws.addRow([]);
  const u = v.totals.uncorrected;
  line("Uncorrected factual", n(u.factual), true);
  line("Uncorrected judgemental", n(u.judgemental), true);
  line("Uncorrected projected", n(u.projected), true);
  line("Uncorrected, current year", n(u.currentYear), true).font = { bold: true };
  line("Gross (without offsetting)", n(u.gross), true);
  line("Corrected by the client (not accumulated)", n(v.totals.corrected.total), true);
  line("Clearly trivial (listed, not accumulated)", n(v.totals.clearlyTrivial.total), true);
  ws.addRow([]);
  ws.addRow([t("Approach"), t("Income statement (rollover)"), t("Balance sheet (iron curtain)")]).font = { bold: true };
  const both = (label: string, a: string, b: string) => {
    const r = ws.addRow([t(label), n(a), n(b)]);
    r.getCell(2).numFmt = MONEY_FORMAT;
    r.getCell(3).numFmt = MONEY_FORMAT;
  };
  const is = v.totals.incomeStatementApproach,
    bs = v.totals.balanceSheetApproach;
  both("Prior-period effect", is.priorPeriod, bs.priorPeriod);
  both("Total uncorrected misstatement", is.total, bs.total);
  both("Margin to performance materiality", is.marginToPerformance, bs.marginToPerformance);
  both("Margin to overall materiality", is.marginToOverall, bs.marginToOverall);
  ws.addRow([]);
  line("Sum of sampling allowances (conservative)", n(v.totals.allowance.sum), true);
  line(v.totals.allowance.note);
  line("Uncorrected (larger approach) + sum of allowances", n(v.totals.upperEstimate), true);
  ws.addRow([]);
  line("Status", v.status.label).font = { bold: true };
  line(v.status.words);
  if (v.status.allowanceWarning) line(v.status.allowanceWarning);
  for (const r of v.status.responses) line(`• ${r}`);
  ws.addRow([]);
  for (const c of v.conventions) line(c);
  line(v.caution);
  ws.getColumn(1).alignment = { wrapText: true, vertical: "top" };
}

function writeRows(wb: ExcelJS.Workbook, v: SummaryView) {
  const ws = wb.addWorksheet("Rows", { views: [{ state: "frozen", ySplit: 1 }] });
  ws.columns = [
    { header: "Reference", key: "reference", width: 11 },
    { header: "Kind", key: "kind", width: 13 },
    { header: "Account / population", key: "account", width: 30 },
    { header: "Assertion", key: "assertion", width: 14 },
    { header: "Description", key: "description", width: 60 },
    { header: "Amount", key: "amount", width: 16 },
    { header: "Income-statement effect", key: "income", width: 16 },
    { header: "Balance-sheet effect", key: "balance", width: 16 },
    { header: "Sampling allowance", key: "allowance", width: 16 },
    { header: "Treatment", key: "treatment", width: 34 },
    { header: "Frozen at sample lock", key: "frozen", width: 10 },
    { header: "Evidence files", key: "evidence", width: 10 },
    { header: "Source (Sondage path)", key: "link", width: 40 },
  ];
  ws.getRow(1).font = { bold: true };
  for (const r of v.rows) {
    const row = ws.addRow({
      reference: t(r.reference),
      kind: t(KIND_LABELS[r.kind]),
      account: t(r.account),
      assertion: t(r.assertion),
      description: t(r.allowanceNote ? `${r.description} ${r.allowanceNote}` : r.description),
      amount: n(r.amount),
      income: n(r.incomeEffect),
      balance: n(r.balanceEffect),
      allowance: n(r.allowance),
      treatment: t(treatmentOf(r)),
      frozen: r.frozen ? "Yes" : "No",
      evidence: r.evidenceCount,
      link: t(r.link),
    });
    for (const k of ["amount", "income", "balance", "allowance"]) row.getCell(k).numFmt = MONEY_FORMAT;
  }
}

/** The summary as a workbook: an overview sheet and one row per line, from the same view model as the page. */
export async function summaryWorkbook(v: SummaryView): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  wb.creator = "Sondage";
  wb.created = new Date(v.generatedAt);
  writeOverview(wb, v);
  writeRows(wb, v);
  return Buffer.from(await wb.xlsx.writeBuffer());
}
