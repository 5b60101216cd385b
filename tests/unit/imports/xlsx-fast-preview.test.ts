import ExcelJS from "exceljs";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { cellText } from "@/lib/imports/source-row";
import { readHeadRowsFast } from "@/lib/imports/inspect-upload";
import { XLSX_BATCH_ROWS, readXlsxRows } from "@/lib/imports/xlsx-rows";

// The reference is exceljs 4.4's own streaming WorkbookReader (the path the full load uses):
// the fast head reader must give the very rows it gives.
const dir = mkdtempSync(path.join(tmpdir(), "sondage-fast-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const file = (name: string) => path.join(dir, name);

function fillLedger(sheet: ExcelJS.Worksheet, rows: number, richText = true) {
  sheet.addRow(["Receivables at 31 December 2024"]);
  sheet.addRow(["Invoice", "Customer", "Amount", "", "Posted", "Paid", "Note"]);
  sheet.mergeCells("C2:D2");
  for (let i = 1; i <= rows; i += 1) {
    const row = sheet.addRow([
      `INV-${i}`,
      richText && i % 3 === 0
        ? { richText: [{ text: "Atelier " }, { text: `Brume ${i}`, font: { bold: true } }] }
        : `Client & Co <${i % 7}>`,
      i % 4 === 0 ? { formula: `${i}*2`, result: i * 2 + 0.25 } : i * 10.5,
      i % 5 === 0 ? { formula: `"EUR"&""`, result: "EUR" } : "EUR",
      i % 2 === 0 ? new Date(Date.UTC(2024, i % 12, (i % 27) + 1)) : 45292 + i,
      i % 6 === 0,
      i % 9 === 0 ? { error: "#N/A" } : null,
    ]);
    row.getCell(5).numFmt = i % 2 === 0 ? "yyyy-mm-dd" : "dd/mm/yyyy";
  }
}

async function referenceRows(filePath: string, sheet: string) {
  // Read to the end (leaving exceljs's loop early races its temporary-file clean-up) and keep
  // the first batch, which is what inspection samples.
  const batches = [];
  for await (const batch of readXlsxRows(filePath, sheet)) batches.push(batch);
  return batches[0].rows.map((row) => ({ rowNumber: row.rowNumber, cells: row.cells.map(cellText) }));
}

beforeAll(async () => {
  const shared = new ExcelJS.Workbook();
  shared.addWorksheet("Notes").addRow(["Prepared by", "Client staff"]);
  fillLedger(shared.addWorksheet("Receivables"), 60);
  fillLedger(shared.addWorksheet("Big"), XLSX_BATCH_ROWS + 300);
  await shared.xlsx.writeFile(file("shared.xlsx"));

  const streamed = new ExcelJS.stream.xlsx.WorkbookWriter({
    filename: file("inline.xlsx"),
    useSharedStrings: false,
    useStyles: true,
  });
  fillLedger(streamed.addWorksheet("Ledger"), 40, false);
  fillLedger(streamed.addWorksheet("Rich"), 5);
  streamed.addWorksheet("Second").addRow(["A", "B"]).commit();
  await streamed.commit();

  const epoch1904 = new ExcelJS.Workbook();
  epoch1904.properties.date1904 = true;
  fillLedger(epoch1904.addWorksheet("Ledger"), 30);
  await epoch1904.xlsx.writeFile(file("dates1904.xlsx"));
});

describe("fast XLSX head reader", () => {
  it.each([
    ["shared.xlsx", "Notes"],
    ["shared.xlsx", "Receivables"],
    ["shared.xlsx", "Big"],
    ["inline.xlsx", "Ledger"],
    ["inline.xlsx", "Second"],
    ["dates1904.xlsx", "Ledger"],
  ])("reads %s / %s exactly as exceljs's streaming reader does", async (name, sheet) => {
    const fast = await readHeadRowsFast(file(name), sheet);
    expect(fast).not.toBeNull();
    expect(fast).toEqual(await referenceRows(file(name), sheet));
  });

  it("stops at the first batch of a long sheet", async () => {
    const fast = await readHeadRowsFast(file("shared.xlsx"), "Big");
    expect(fast).toHaveLength(XLSX_BATCH_ROWS);
    expect(fast?.[1].cells.slice(0, 3)).toEqual(["Invoice", "Customer", "Amount"]);
    // Row 6 holds invoice 4, whose amount is a formula with cached result 4*2+0.25.
    expect(fast?.[5].cells[2]).toBe("8.25");
  });

  it("declines (null) what it does not read, so inspection falls back to exceljs", async () => {
    expect(await readHeadRowsFast(file("shared.xlsx"), "Missing")).toBeNull();
    // exceljs keeps only the last run of a rich inline string; the fast reader leaves it to exceljs.
    expect(await readHeadRowsFast(file("inline.xlsx"), "Rich")).toBeNull();
    expect(await readHeadRowsFast(path.join(dir, "absent.xlsx"), "Notes")).toBeNull();
  });
});
