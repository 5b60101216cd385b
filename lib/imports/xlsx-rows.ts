import "server-only";
import { createReadStream } from "node:fs";
import { stat } from "node:fs/promises";
import ExcelJS from "exceljs";
import { ImportError } from "./import-error";
import type { RawCell, SourceBatch } from "./source-row";
import { normalizeCell } from "./xlsx-cells";
import { readXlsxRowsFast, type FastReadOptions } from "./xlsx-fast-rows";

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
  let given = false;
  try {
    for await (const worksheet of reader) {
      // Sheets after the wanted one are passed over rather than the loop left: exceljs deletes a
      // sheet it parked in a temporary file only when its iteration moves past that sheet.
      if (found || (worksheet as unknown as { name: string }).name !== sheetName) {
        ignoreUnreadSheet(worksheet);
        continue;
      }
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
      given = true;
    }
  } catch (error) {
    if (given) return; // a fault in a part after the wanted sheet does not undo the rows already given
    if (error instanceof ImportError) throw error;
    throw new ImportError(
      "unreadable-file",
      `The workbook could not be read: ${error instanceof Error ? error.message : String(error)}`,
    );
  } finally {
    input.destroy();
  }
  if (!found) throw new ImportError("sheet-not-found", `The workbook has no sheet named "${sheetName}".`);
}

/**
 * A sheet stored before the workbook's part list is parked by exceljs in a temporary file; when the
 * caller skips the sheet, exceljs deletes that file at once, while the read stream it just made for
 * it may still be opening. The stream's ENOENT would then have no listener and end the process.
 */
function ignoreUnreadSheet(worksheet: unknown) {
  const source = (worksheet as { iterator?: { on?: unknown } }).iterator;
  if (source && typeof source.on === "function") (source as NodeJS.ReadableStream).on("error", () => {});
}

/**
 * Every row of one sheet for a full load: the fast reader (xlsx-fast-rows.ts, the one the preview
 * uses), and exceljs only for what it cannot read — when the fast reader meets a construct it does
 * not understand, exceljs carries on from the row after the last one already given. Refusals
 * (ImportError: a zip bomb, a missing sheet) are not retried. `options` go to the fast reader
 * (exceljs gives whole rows whatever they say).
 */
export async function* readXlsxRowsForLoad(
  filePath: string,
  sheetName: string,
  onFallback?: (reason: string) => void,
  options?: FastReadOptions,
): AsyncGenerator<SourceBatch> {
  let lastRow = 0;
  try {
    const { size } = await stat(filePath);
    for await (const batch of readXlsxRowsFast(filePath, sheetName, size, XLSX_BATCH_ROWS, options)) {
      if (batch.rows.length) lastRow = batch.rows[batch.rows.length - 1].rowNumber;
      yield batch;
    }
    return;
  } catch (err) {
    if (err instanceof ImportError) throw err;
    onFallback?.(err instanceof Error ? err.message : String(err));
  }
  for await (const batch of readXlsxRows(filePath, sheetName)) {
    const rows = batch.rows.filter((row) => row.rowNumber > lastRow);
    if (rows.length) yield { ...batch, rows };
  }
}
