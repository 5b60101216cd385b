import { createReadStream } from "node:fs";
import ExcelJS from "exceljs";
import Papa from "papaparse";

/**
 * Writes the same ledger as a CSV into one worksheet of an .xlsx (exceljs's streaming writer,
 * shared strings as Excel itself saves them): text stays text, Amount becomes a number cell with
 * a 2-decimal format, Posted and Due become date cells — so the load reads the same items and the
 * same totals from either file.
 */
export async function csvToXlsx(csvPath: string, xlsxPath: string): Promise<number> {
  const workbook = new ExcelJS.stream.xlsx.WorkbookWriter({
    filename: xlsxPath,
    useSharedStrings: true,
    useStyles: true,
  });
  const sheet = workbook.addWorksheet("Ledger");
  let header: string[] | null = null;
  let rows = 0;
  await new Promise<void>((resolve, reject) => {
    Papa.parse<string[]>(createReadStream(csvPath, { encoding: "utf8" }), {
      skipEmptyLines: true,
      step: ({ data }) => {
        if (!header) {
          header = data;
          sheet.addRow(data).commit();
          return;
        }
        const values = data.map((text, i) => {
          const name = header![i];
          if (name === "Amount") return Number(text);
          if (name === "Posted" || name === "Due") return new Date(`${text}T00:00:00Z`);
          return text;
        });
        const row = sheet.addRow(values);
        row.getCell(header.indexOf("Amount") + 1).numFmt = "#,##0.00";
        row.getCell(header.indexOf("Posted") + 1).numFmt = "yyyy-mm-dd";
        row.getCell(header.indexOf("Due") + 1).numFmt = "yyyy-mm-dd";
        row.commit();
        rows += 1;
      },
      complete: () => resolve(),
      error: reject,
    });
  });
  sheet.commit();
  await workbook.commit();
  return rows;
}
