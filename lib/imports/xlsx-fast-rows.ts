import "server-only";
import type { ZipEntry } from "@/lib/files/zip";
import { isBlankSourceRow, type SourceBatch, type SourceRow } from "./source-row";
import { addCell, columnNumber, styleFormat, toSourceRow, type OpenCell, type PendingRow } from "./xlsx-cell-values";
import { readWorkbookParts, xmlTokens, type WorkbookParts } from "./xlsx-parts";
import { SheetScanner } from "./xlsx-sheet-scanner";
import { readSharedStrings, type SharedString } from "./xlsx-shared-strings";
import { UnsupportedXlsxError, XmlTokenizer, type XmlToken } from "./xml-tokens";
import { streamZipEntryText } from "./zip-entry-stream";

/**
 * Turns a worksheet part's XML tokens into rows as exceljs's streaming reader would give them,
 * shared strings left as indexes. Throws UnsupportedXlsxError on anything it does not understand.
 */
export class SheetRowParser {
  /** Highest shared-string index seen so far. */
  lastShared = -1;
  /** True once </sheetData> has been seen. */
  finished = false;
  private inData = false;
  private row: PendingRow | null = null;
  private cell: OpenCell | null = null;
  private capture: "formula" | "value" | null = null;

  private readonly tokenizer = new XmlTokenizer();

  constructor(private readonly parts: WorkbookParts) {}

  private closeCell() {
    const { row, cell } = this;
    if (!row || !cell) return;
    this.lastShared = Math.max(this.lastShared, addCell(this.parts, row, cell));
    [this.cell, this.capture] = [null, null];
  }

  /** The rows a chunk of the part's text completes (the same interface as SheetScanner). */
  pushText(text: string, out: PendingRow[]): void {
    this.push(this.tokenizer.push(text), out);
  }

  /** The rows the tokens complete; stops early (returning what it has) once `limit` rows are out. */
  push(tokens: XmlToken[], out: PendingRow[], limit = Infinity): void {
    for (const token of tokens) {
      if (this.finished || out.length >= limit) return;
      const cell = this.cell;
      if (token.kind === "text") {
        if (this.capture && cell) cell[this.capture] = (cell[this.capture] ?? "") + token.text;
        else if (cell && token.text !== "") throw new UnsupportedXlsxError("text outside <v>");
        continue;
      }
      const name = token.name;
      if (token.kind === "close") {
        if (name === "sheetData") this.finished = true;
        else if (name === "c") this.closeCell();
        else if (name === "row" && this.row) {
          out.push(this.row);
          this.row = null;
        } else if (name === "f" || name === "v" || name === "t") this.capture = null;
        continue;
      }
      if (name === "sheetData") this.inData = !token.selfClosing;
      else if (!this.inData) continue;
      else if (name === "row") {
        const rowNumber = parseInt(token.attrs.r, 10);
        if (!Number.isFinite(rowNumber)) throw new UnsupportedXlsxError("row without r");
        const rowStyle = token.attrs.s ? styleFormat(this.parts, parseInt(token.attrs.s, 10)) : null;
        const row: PendingRow = { rowNumber, rowFormat: rowStyle?.format, cells: [] };
        if (token.selfClosing) out.push(row);
        else this.row = row;
      } else if (name === "c" && this.row) {
        this.cell = {
          column: columnNumber(token.attrs.r),
          style: parseInt(token.attrs.s, 10) || 0,
          type: token.attrs.t,
          texts: 0,
        };
        if (token.selfClosing) this.closeCell();
      } else if (cell && (name === "f" || name === "v")) {
        this.capture = token.selfClosing ? null : name === "f" ? "formula" : "value";
        if (name === "f") cell.formula = "";
        else cell.value = "";
      } else if (cell && name === "is") cell.value = "";
      else if (cell && name === "t") {
        cell.texts += 1;
        if (cell.texts > 1) throw new UnsupportedXlsxError("rich inline string");
        [cell.value, this.capture] = ["", token.selfClosing ? null : "value"];
      } else if (cell) throw new UnsupportedXlsxError(`<${name}> in a cell`);
    }
  }
}

async function openSheet(filePath: string, sheetName: string) {
  const parts = await readWorkbookParts(filePath, sheetName);
  const sheet = parts.entries.get(parts.sheetPath);
  if (!sheet || !parts.entries.get("xl/styles.xml")) throw new UnsupportedXlsxError("sheet or styles part missing");
  return { parts, sheet, strings: parts.entries.get("xl/sharedStrings.xml") };
}

/**
 * The first `maxRows` rows of one sheet, read without exceljs: only the start of the worksheet
 * part is inflated, and shared strings only up to the highest index those rows use. Gives the
 * same cells as readXlsxRows; throws UnsupportedXlsxError on anything it does not understand.
 */
export async function readXlsxHeadRows(filePath: string, sheetName: string, maxRows: number): Promise<SourceRow[]> {
  const { parts, sheet, strings: stringsEntry } = await openSheet(filePath, sheetName);
  const parser = new SheetRowParser(parts);
  const rows: PendingRow[] = [];
  for await (const tokens of xmlTokens(filePath, sheet)) {
    parser.push(tokens, rows, maxRows);
    if (parser.finished || rows.length >= maxRows) break;
  }
  if (parser.lastShared >= 0 && !stringsEntry) throw new UnsupportedXlsxError("no shared strings part");
  const strings: SharedString[] = stringsEntry
    ? await readSharedStrings(filePath, stringsEntry, parser.lastShared)
    : [];
  return rows.map((pending) => toSourceRow(pending, strings, parts.date1904));
}

export interface FastReadOptions {
  /**
   * Rows only as far as their first non-blank cell (the rest of a row is not read, where the
   * scanner reads it): enough to tell blank rows from data rows, as a row counter needs.
   */
  untilFirstValue?: boolean;
}

/**
 * Every row of one sheet, streamed in batches without exceljs: the shared strings are read once,
 * then the worksheet part is inflated and read as it streams — by SheetScanner, and where it meets
 * what it does not read, by the general tokenizer's parser from the row after the last one given.
 * Gives the same cells as readXlsxRows (exceljs), several times faster; throws UnsupportedXlsxError
 * (possibly after some batches) on anything neither understands, so the caller can carry on with
 * exceljs. `bytesRead` is the share of the sheet part inflated so far, scaled to the file's size.
 */
export async function* readXlsxRowsFast(
  filePath: string,
  sheetName: string,
  fileSize: number,
  batchRows: number,
  { untilFirstValue = false }: FastReadOptions = {},
): AsyncGenerator<SourceBatch> {
  const { parts, sheet, strings: stringsEntry } = await openSheet(filePath, sheetName);
  const strings: SharedString[] = stringsEntry
    ? await readSharedStrings(filePath, stringsEntry, Number.MAX_SAFE_INTEGER)
    : [];
  const read = { filePath, sheet, parts, strings, fileSize, batchRows };
  const hasValue = (row: PendingRow) => {
    const last = row.cells[row.cells.length - 1];
    if (!last) return false;
    const { cells } = toSourceRow({ rowNumber: row.rowNumber, cells: [last] }, strings, parts.date1904);
    return !isBlankSourceRow(cells);
  };
  let lastRow = 0;
  try {
    for await (const batch of readSheetRows(read, new SheetScanner(parts, untilFirstValue ? hasValue : undefined))) {
      if (batch.rows.length) lastRow = batch.rows[batch.rows.length - 1].rowNumber;
      yield batch;
    }
    return;
  } catch (error) {
    if (!(error instanceof UnsupportedXlsxError)) throw error;
  }
  for await (const batch of readSheetRows(read, new SheetRowParser(parts))) {
    const rows = batch.rows.filter((row) => row.rowNumber > lastRow);
    if (rows.length) yield { ...batch, rows };
  }
}

interface SheetRead {
  filePath: string;
  sheet: ZipEntry;
  parts: WorkbookParts;
  strings: SharedString[];
  fileSize: number;
  batchRows: number;
}

async function* readSheetRows(
  { filePath, sheet, parts, strings, fileSize, batchRows }: SheetRead,
  parser: { lastShared: number; finished: boolean; pushText(text: string, out: PendingRow[]): void },
): AsyncGenerator<SourceBatch> {
  const sheetChars = Math.max(1, sheet.size);
  let chars = 0;
  let pending: PendingRow[] = [];
  const batch = () => {
    if (parser.lastShared >= strings.length)
      throw new UnsupportedXlsxError(`shared string ${parser.lastShared} missing`);
    const rows = pending.map((p) => toSourceRow(p, strings, parts.date1904));
    pending = [];
    return { rows, quoteProblems: [], bytesRead: Math.min(fileSize, Math.round((fileSize * chars) / sheetChars)) };
  };
  for await (const text of streamZipEntryText(filePath, sheet)) {
    chars += text.length;
    parser.pushText(text, pending);
    if (pending.length >= batchRows) yield batch();
    if (parser.finished) break;
  }
  if (!parser.finished) throw new UnsupportedXlsxError(`${sheet.name}: cut short`);
  yield batch();
}
