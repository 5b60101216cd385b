import "server-only";
import type { CellValue } from "exceljs";
import type { RawCell, SourceBatch, SourceRow } from "./source-row";
import { readWorkbookParts, type WorkbookParts } from "./xlsx-parts";
import { readSharedStrings, type SharedString } from "./xlsx-shared-strings";
import { normalizeValue } from "./xlsx-cells";
import { UnsupportedXlsxError, XmlTokenizer, type XmlToken } from "./xml-tokens";
import { xmlTokens } from "./xlsx-parts";
import { streamZipEntryText } from "./zip-entry-stream";

interface OpenCell {
  column: number;
  style: number;
  type?: string;
  formula?: string;
  value?: string;
  texts: number;
}
type Pending = CellValue | { sharedIndex: number };
interface PendingRow {
  rowNumber: number;
  rowFormat?: string;
  cells: { column: number; value: Pending; format?: string }[];
}

/** exceljs's date-format test and serial conversion (utils.isDateFmt / excelToDate), kept as is so both paths agree. */
function exceljsIsDateFormat(format: string | undefined): boolean {
  return !!format && /[ymdhMsb]+/.test(format.replace(/\[[^\]]*]/g, "").replace(/"[^"]*"/g, ""));
}
function exceljsDate(serial: number, date1904: boolean): Date {
  return new Date(Math.round((serial - 25569 + (date1904 ? 1462 : 0)) * 86_400_000));
}

const EXCELJS_ENTITIES: Record<string, string> = {
  "&lt;": "<",
  "&gt;": ">",
  "&amp;": "&",
  "&apos;": "'",
  "&quot;": '"',
};
/** exceljs decodes str/inlineStr text a second time (utils.xmlDecode). */
function exceljsXmlDecode(text: string): string {
  return text.replace(/&([a-z]*);/g, (entity) => EXCELJS_ENTITIES[entity] ?? entity);
}

function columnNumber(ref: string | undefined): number {
  const letters = /^([A-Z]{1,3})\d+$/.exec(ref ?? "")?.[1];
  if (!letters) throw new UnsupportedXlsxError(`cell reference ${ref}`);
  return [...letters].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0);
}

/** A cell's value as exceljs's streaming worksheet reader sets it (worksheet-reader.js). */
function cellValue(c: OpenCell, format: string | undefined, date1904: boolean): Pending | undefined {
  if (c.formula !== undefined) {
    const result =
      c.value === undefined ? undefined : c.type === "str" ? exceljsXmlDecode(c.value) : parseFloat(c.value);
    return { formula: c.formula, result };
  }
  if (c.value === undefined) return undefined;
  if (c.type === "s") return { sharedIndex: parseInt(c.value, 10) };
  if (c.type === "inlineStr" || c.type === "str") return exceljsXmlDecode(c.value);
  if (c.type === "e") return { error: c.value } as CellValue;
  if (c.type === "b") return parseInt(c.value, 10) !== 0;
  const number = parseFloat(c.value);
  if (!Number.isFinite(number)) throw new UnsupportedXlsxError(`number ${c.value}`);
  return exceljsIsDateFormat(format) ? exceljsDate(number, date1904) : number;
}

/**
 * Turns a worksheet part's XML tokens into rows as exceljs's streaming reader would give them,
 * shared strings left as indexes. Throws UnsupportedXlsxError on anything it does not understand.
 */
class SheetRowParser {
  /** Highest shared-string index seen so far. */
  lastShared = -1;
  /** True once </sheetData> has been seen. */
  finished = false;
  private inData = false;
  private row: PendingRow | null = null;
  private cell: OpenCell | null = null;
  private capture: "formula" | "value" | null = null;

  constructor(private readonly parts: WorkbookParts) {}

  private styleFormat(id: number) {
    return id < this.parts.styleFormats.length ? { format: this.parts.styleFormats[id] } : null;
  }

  private closeCell() {
    const { row, cell } = this;
    if (!row || !cell) return;
    const own = cell.style ? this.styleFormat(cell.style) : null;
    const format = own ? own.format : row.rowFormat;
    const value = cellValue(cell, format, this.parts.date1904);
    if (value !== undefined) row.cells.push({ column: cell.column, value, format });
    if (value && typeof value === "object" && "sharedIndex" in value)
      this.lastShared = Math.max(this.lastShared, value.sharedIndex);
    [this.cell, this.capture] = [null, null];
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
        const rowStyle = token.attrs.s ? this.styleFormat(parseInt(token.attrs.s, 10)) : null;
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

/**
 * Every row of one sheet, streamed in batches without exceljs: the shared strings are read once,
 * then the worksheet part is inflated and parsed as it streams. Gives the same cells as
 * readXlsxRows (exceljs), several times faster; throws UnsupportedXlsxError (possibly after some
 * batches) on anything it does not understand, so the caller can carry on with exceljs.
 * `bytesRead` is the share of the sheet part inflated so far, scaled to the file's size.
 */
export async function* readXlsxRowsFast(
  filePath: string,
  sheetName: string,
  fileSize: number,
  batchRows: number,
): AsyncGenerator<SourceBatch> {
  const { parts, sheet, strings: stringsEntry } = await openSheet(filePath, sheetName);
  const strings: SharedString[] = stringsEntry
    ? await readSharedStrings(filePath, stringsEntry, Number.MAX_SAFE_INTEGER)
    : [];
  const parser = new SheetRowParser(parts);
  const tokenizer = new XmlTokenizer();
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
    parser.push(tokenizer.push(text), pending);
    if (pending.length >= batchRows) yield batch();
    if (parser.finished) break;
  }
  if (!parser.finished) throw new UnsupportedXlsxError(`${sheet.name}: cut short`);
  yield batch();
}

function toSourceRow(pending: PendingRow, strings: SharedString[], date1904: boolean): SourceRow {
  const cells: RawCell[] = [];
  for (const { column, value, format } of pending.cells) {
    const resolved =
      value && typeof value === "object" && "sharedIndex" in value ? (strings[value.sharedIndex] ?? null) : value;
    const normalized = normalizeValue(resolved, format, date1904);
    if (normalized === null) continue;
    while (cells.length < column - 1) cells.push(null);
    cells[column - 1] = normalized;
  }
  return { rowNumber: pending.rowNumber, cells };
}
