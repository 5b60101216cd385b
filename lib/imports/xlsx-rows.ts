import "server-only";
import { createReadStream } from "node:fs";
import ExcelJS from "exceljs";
import { ImportError } from "./import-error";
import type { RawCell, SourceBatch } from "./source-row";
import { normalizeCell } from "./xlsx-cells";

/** Rows in each batch; inspection samples the first batch. */
export const XLSX_BATCH_ROWS = 2000;

interface ReaderInternals {
  properties?: { model?: { date1904?: boolean } };
}

/**
 * Streams one worksheet of an .xlsx file as batches of rows with exceljs's WorkbookReader
 * (shared strings and styles cached, so date formats are known). Row numbers are Excel's own.
 * exceljs's streaming reader does not report merged ranges: a merged cell arrives as its
 * top-left value with blank neighbours.
 */
export async function* readXlsxRows(filePath: string, sheetName: string): AsyncGenerator<SourceBatch> {
  const input = createReadStream(filePath);
  let bytesRead = 0;
  input.on("data", (chunk) => {
    bytesRead += chunk.length;
  });
  const reader = new ExcelJS.stream.xlsx.WorkbookReader(input, {
    sharedStrings: "cache",
    styles: "cache",
    hyperlinks: "ignore",
    worksheets: "emit",
    entries: "ignore",
  });
  let found = false;
  try {
    for await (const worksheet of reader) {
      if ((worksheet as unknown as { name: string }).name !== sheetName) continue;
      found = true;
      const date1904 = (reader as unknown as ReaderInternals).properties?.model?.date1904 === true;
      let rows: SourceBatch["rows"] = [];
      for await (const row of worksheet) {
        const cells: RawCell[] = [];
        row.eachCell({ includeEmpty: false }, (cell, column) => {
          while (cells.length < column - 1) cells.push(null);
          cells[column - 1] = normalizeCell(cell, date1904);
        });
        rows.push({ rowNumber: row.number, cells });
        if (rows.length >= XLSX_BATCH_ROWS) {
          yield { rows, quoteProblems: [], bytesRead };
          rows = [];
        }
      }
      yield { rows, quoteProblems: [], bytesRead };
      break;
    }
  } catch (error) {
    if (error instanceof ImportError) throw error;
    throw new ImportError("unreadable-file", `The workbook could not be read: ${error instanceof Error ? error.message : String(error)}`);
  } finally {
    input.destroy();
  }
  if (!found) throw new ImportError("sheet-not-found", `The workbook has no sheet named "${sheetName}".`);
}
