import "server-only";
import type { CellValue } from "exceljs";
import type { RawCell, SourceRow } from "./source-row";
import type { SharedString } from "./xlsx-shared-strings";
import type { WorkbookParts } from "./xlsx-parts";
import { normalizeValue } from "./xlsx-cells";
import { UnsupportedXlsxError } from "./xml-tokens";

/** A `<c>` element being read: its attributes and the text of its `<f>`, `<v>` or inline `<t>`. */
export interface OpenCell {
  column: number;
  style: number;
  type?: string;
  formula?: string;
  value?: string;
  texts: number;
}
export type Pending = CellValue | { sharedIndex: number };
/** A row read from the sheet, shared strings still as indexes. */
export interface PendingRow {
  rowNumber: number;
  rowFormat?: string;
  cells: { column: number; value: Pending; format?: string }[];
}

const dateFormats = new Map<string, boolean>();
/** exceljs's date-format test (utils.isDateFmt), kept as is so both paths agree; remembered per format. */
function exceljsIsDateFormat(format: string | undefined): boolean {
  if (!format) return false;
  let known = dateFormats.get(format);
  if (known === undefined) {
    known = /[ymdhMsb]+/.test(format.replace(/\[[^\]]*]/g, "").replace(/"[^"]*"/g, ""));
    if (dateFormats.size < 1000) dateFormats.set(format, known);
  }
  return known;
}
/** exceljs's serial conversion (utils.excelToDate). */
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
  return text.includes("&") ? text.replace(/&([a-z]*);/g, (entity) => EXCELJS_ENTITIES[entity] ?? entity) : text;
}

/** The column of a cell reference such as "AB12" (1-based); anything else is not read here. */
export function columnNumber(ref: string | undefined): number {
  if (ref === undefined) throw new UnsupportedXlsxError("cell without a reference");
  let column = 0;
  let i = 0;
  for (; i < ref.length && i < 4; i += 1) {
    const code = ref.charCodeAt(i);
    if (code < 65 || code > 90) break;
    column = column * 26 + code - 64;
  }
  const letters = i;
  for (; i < ref.length; i += 1) {
    const code = ref.charCodeAt(i);
    if (code < 48 || code > 57) break;
  }
  if (letters < 1 || letters > 3 || i === letters || i !== ref.length)
    throw new UnsupportedXlsxError(`cell reference ${ref}`);
  return column;
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

/** The number format of a cellXfs style id, or null for an id the styles part does not have. */
export function styleFormat(parts: WorkbookParts, id: number): { format: string | undefined } | null {
  return id < parts.styleFormats.length ? { format: parts.styleFormats[id] } : null;
}

/** Adds a finished cell to its row as exceljs would; returns its shared-string index, or -1. */
export function addCell(parts: WorkbookParts, row: PendingRow, cell: OpenCell): number {
  const { style } = cell;
  const format = style && style < parts.styleFormats.length ? parts.styleFormats[style] : row.rowFormat;
  const value = cellValue(cell, format, parts.date1904);
  if (value !== undefined) row.cells.push({ column: cell.column, value, format });
  return value && typeof value === "object" && "sharedIndex" in value ? value.sharedIndex : -1;
}

export function toSourceRow(pending: PendingRow, strings: SharedString[], date1904: boolean): SourceRow {
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
