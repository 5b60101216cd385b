import "server-only";
import type { CellValue } from "exceljs";
import type { RawCell, SourceRow } from "./source-row";
import { readWorkbookParts } from "./xlsx-parts";
import { readSharedStrings, type SharedString } from "./xlsx-shared-strings";
import { normalizeValue } from "./xlsx-cells";
import { UnsupportedXlsxError } from "./xml-tokens";
import { xmlTokens } from "./xlsx-parts";

interface OpenCell { column: number; style: number; type?: string; formula?: string; value?: string; texts: number }
type Pending = CellValue | { sharedIndex: number };
interface PendingRow { rowNumber: number; rowFormat?: string; cells: { column: number; value: Pending; format?: string }[] }

/** exceljs's date-format test and serial conversion (utils.isDateFmt / excelToDate), kept as is so both paths agree. */
function exceljsIsDateFormat(format: string | undefined): boolean {
  return !!format && /[ymdhMsb]+/.test(format.replace(/\[[^\]]*]/g, "").replace(/"[^"]*"/g, ""));
}
function exceljsDate(serial: number, date1904: boolean): Date {
  return new Date(Math.round((serial - 25569 + (date1904 ? 1462 : 0)) * 86_400_000));
}

const EXCELJS_ENTITIES: Record<string, string> = { "&lt;": "<", "&gt;": ">", "&amp;": "&", "&apos;": "'", "&quot;": '"' };
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
    const result = c.value === undefined ? undefined : c.type === "str" ? exceljsXmlDecode(c.value) : parseFloat(c.value);
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
 * The first `maxRows` rows of one sheet, read without exceljs: only the start of the worksheet
 * part is inflated, and shared strings only up to the highest index those rows use. Gives the
 * same cells as readXlsxRows; throws UnsupportedXlsxError on anything it does not understand.
 */
export async function readXlsxHeadRows(filePath: string, sheetName: string, maxRows: number): Promise<SourceRow[]> {
  const parts = await readWorkbookParts(filePath, sheetName);
  const sheet = parts.entries.get(parts.sheetPath);
  const stylesEntry = parts.entries.get("xl/styles.xml");
  if (!sheet || !stylesEntry) throw new UnsupportedXlsxError("sheet or styles part missing");
  const styleFormat = (id: number) => (id < parts.styleFormats.length ? { format: parts.styleFormats[id] } : null);
  const rows: PendingRow[] = [];
  let lastShared = -1;
  let inData = false;
  let row: PendingRow | null = null;
  let cell: OpenCell | null = null;
  let capture: "formula" | "value" | null = null;
  const closeCell = () => {
    if (!row || !cell) return;
    const own = cell.style ? styleFormat(cell.style) : null;
    const format = own ? own.format : row.rowFormat;
    const value = cellValue(cell, format, parts.date1904);
    if (value !== undefined) row.cells.push({ column: cell.column, value, format });
    if (value && typeof value === "object" && "sharedIndex" in value) lastShared = Math.max(lastShared, value.sharedIndex);
    [cell, capture] = [null, null];
  };
  reading: for await (const tokens of xmlTokens(filePath, sheet)) {
    for (const token of tokens) {
      if (token.kind === "text") {
        if (capture && cell) cell[capture] = (cell[capture] ?? "") + token.text;
        else if (cell && token.text !== "") throw new UnsupportedXlsxError("text outside <v>");
        continue;
      }
      const name = token.name;
      if (token.kind === "close") {
        if (name === "sheetData") break reading;
        if (name === "c") closeCell();
        else if (name === "row" && row) {
          rows.push(row);
          row = null;
          if (rows.length >= maxRows) break reading;
        } else if (name === "f" || name === "v" || name === "t") capture = null;
        continue;
      }
      if (name === "sheetData") inData = !token.selfClosing;
      else if (!inData) continue;
      else if (name === "row") {
        const rowNumber = parseInt(token.attrs.r, 10);
        if (!Number.isFinite(rowNumber)) throw new UnsupportedXlsxError("row without r");
        const rowStyle = token.attrs.s ? styleFormat(parseInt(token.attrs.s, 10)) : null;
        row = { rowNumber, rowFormat: rowStyle?.format, cells: [] };
        if (token.selfClosing) [rows[rows.length], row] = [row, null];
      } else if (name === "c" && row) {
        cell = { column: columnNumber(token.attrs.r), style: parseInt(token.attrs.s, 10) || 0, type: token.attrs.t, texts: 0 };
        if (token.selfClosing) closeCell();
      } else if (cell && (name === "f" || name === "v")) {
        capture = token.selfClosing ? null : name === "f" ? "formula" : "value";
        if (name === "f") cell.formula = "";
        else cell.value = "";
      } else if (cell && name === "is") cell.value = "";
      else if (cell && name === "t") {
        cell.texts += 1;
        if (cell.texts > 1) throw new UnsupportedXlsxError("rich inline string");
        [cell.value, capture] = ["", token.selfClosing ? null : "value"];
      } else if (cell) throw new UnsupportedXlsxError(`<${name}> in a cell`);
    }
  }
  const stringsEntry = parts.entries.get("xl/sharedStrings.xml");
  if (lastShared >= 0 && !stringsEntry) throw new UnsupportedXlsxError("no shared strings part");
  const strings: SharedString[] = stringsEntry ? await readSharedStrings(filePath, stringsEntry, lastShared) : [];
  return rows.map((pending) => toSourceRow(pending, strings, parts.date1904));
}

function toSourceRow(pending: PendingRow, strings: SharedString[], date1904: boolean): SourceRow {
  const cells: RawCell[] = [];
  for (const { column, value, format } of pending.cells) {
    const resolved = value && typeof value === "object" && "sharedIndex" in value ? (strings[value.sharedIndex] ?? null) : value;
    const normalized = normalizeValue(resolved, format, date1904);
    if (normalized === null) continue;
    while (cells.length < column - 1) cells.push(null);
    cells[column - 1] = normalized;
  }
  return { rowNumber: pending.rowNumber, cells };
}
