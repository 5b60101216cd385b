import type ExcelJS from "exceljs";

/**
 * An invented ledger with every kind of cell a workbook holds: shared and rich-text strings, numbers,
 * formulas with cached number and text results, dates under two formats, date serials, booleans,
 * error cells and empty cells. `richAt` says which customers are rich text.
 */
export function fillLedger(sheet: ExcelJS.Worksheet, rows: number, richAt: (i: number) => boolean) {
  sheet.addRow(["Invoice", "Customer", "Amount", "Currency", "Posted", "Paid", "Note"]);
  for (let i = 1; i <= rows; i += 1) {
    const row = sheet.addRow([
      `INV-${i}`,
      richAt(i)
        ? { richText: [{ text: "Atelier " }, { text: `Brume ${i}`, font: { bold: true } }] }
        : `Client & Co <${i % 7}>`,
      i % 4 === 0 ? { formula: `${i}*2`, result: i * 2 + 0.25 } : i * 10.5,
      i % 5 === 0 ? { formula: `"EUR"&""`, result: "EUR" } : "EUR",
      i % 2 === 0 ? new Date(Date.UTC(2024, i % 12, (i % 27) + 1)) : 45292 + i,
      i % 6 === 0,
      i % 9 === 0 ? { error: "#N/A" } : null,
    ]);
    row.getCell(5).numFmt = i % 2 === 0 ? "yyyy-mm-dd" : "dd/mm/yyyy";
    if ("commit" in row && typeof row.commit === "function") row.commit();
  }
}
