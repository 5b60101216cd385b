import "server-only";
import type { PopulationMapping } from "@/lib/validation/population-mapping";
import { parseAmountToCents, type NumberFormat } from "./amount";
import { dateToIsoDate, excelSerialToIsoDate, parseDateText, type DateOrder } from "./dates";
import { columnLetter } from "./header-row";
import { ImportError } from "./import-error";
import { numberToPlainDecimal } from "./number-format";
import { cellText, type RawCell, type SourceRow } from "./source-row";

export const MAX_ITEM_REF_LENGTH = 255;

/** A data row that passed every check, ready to load. */
export interface ValidatedRow {
  rowNumber: number;
  itemRef: string;
  description: string | null;
  bookValueCents: bigint;
  /** ISO date YYYY-MM-DD. */
  date: string | null;
  /** The kept extra columns (non-blank values only), or null when none were chosen. */
  extra: Record<string, string> | null;
}

/** One problem in one row; `row` is the row number the user sees, `column` the header name. */
export interface RowProblem {
  row: number;
  column: string | null;
  reason: string;
}

export interface CompiledMapping {
  headers: string[];
  itemRef: number;
  bookValue: number;
  description: number | null;
  date: number | null;
  extras: { index: number; name: string }[];
  numberFormat: NumberFormat;
  dateOrder: DateOrder;
  /** CSV: every row must have exactly this many fields. */
  fieldCount: number | null;
  date1904: boolean;
}

export function compileMapping(
  headers: string[],
  mapping: PopulationMapping,
  settings: { numberFormat: NumberFormat; dateOrder: DateOrder; fieldCount: number | null; date1904: boolean },
): CompiledMapping {
  const indexOf = (name: string | undefined): number | null => {
    if (name === undefined) return null;
    const index = headers.findIndex((header) => header.toLowerCase() === name.trim().toLowerCase());
    if (index < 0) throw new ImportError("invalid-mapping", `The file has no column named "${name}".`);
    return index;
  };
  return {
    headers,
    itemRef: indexOf(mapping.itemRefColumn) as number,
    bookValue: indexOf(mapping.bookValueColumn) as number,
    description: indexOf(mapping.descriptionColumn),
    date: indexOf(mapping.dateColumn),
    extras: mapping.extraColumns.map((name) => ({
      index: indexOf(name) as number,
      name: headers[indexOf(name) as number],
    })),
    ...settings,
  };
}

function quote(value: string): string {
  return `"${value.length > 60 ? `${value.slice(0, 57)}...` : value}"`;
}

function addProblem(
  problems: RowProblem[],
  row: SourceRow,
  m: CompiledMapping,
  column: number | null,
  reason: string,
): void {
  problems.push({ row: row.rowNumber, column: column === null ? null : m.headers[column], reason });
}

/** Checks one data row; problems go to `problems`, and the row is returned only when it has none. */
export function validateRow(row: SourceRow, m: CompiledMapping, problems: RowProblem[]): ValidatedRow | null {
  const before = problems.length;
  const { cells } = row;
  if (m.fieldCount !== null && cells.length !== m.fieldCount) {
    addProblem(
      problems,
      row,
      m,
      null,
      `Row has ${cells.length} field${cells.length === 1 ? "" : "s"}; the header row has ${m.fieldCount}`,
    );
    return null;
  }
  for (let i = m.headers.length; i < cells.length; i += 1) {
    const text = cellText(cells[i] ?? null);
    if (text.trim() !== "")
      addProblem(problems, row, m, null, `Value ${quote(text)} is in column ${columnLetter(i)}, which has no header`);
  }
  const itemRef = cellText(cells[m.itemRef] ?? null).trim();
  if (itemRef === "") addProblem(problems, row, m, m.itemRef, "Item reference is blank");
  else if (itemRef.length > MAX_ITEM_REF_LENGTH)
    addProblem(problems, row, m, m.itemRef, `Item reference is longer than ${MAX_ITEM_REF_LENGTH} characters`);
  const cents = bookValueCents(cells[m.bookValue] ?? null, m.numberFormat);
  if (typeof cents === "string") addProblem(problems, row, m, m.bookValue, cents);
  let date: string | null = null;
  if (m.date !== null) {
    const cell = cells[m.date] ?? null;
    date = readDate(cell, m);
    if (date === "") addProblem(problems, row, m, m.date, badDateReason(cell, m));
  }
  if (problems.length > before || typeof cents === "string") return null;
  const descriptionText = m.description === null ? "" : cellText(cells[m.description] ?? null);
  let extra: Record<string, string> | null = null;
  if (m.extras.length > 0) {
    extra = {};
    for (const { index, name } of m.extras) {
      const text = cellText(cells[index] ?? null);
      if (text !== "") extra[name] = text;
    }
  }
  return {
    rowNumber: row.rowNumber,
    itemRef,
    description: descriptionText.trim() === "" ? null : descriptionText,
    bookValueCents: cents,
    date,
    extra,
  };
}

/** Cents, or the reason the cell is not an acceptable book value. */
function bookValueCents(cell: RawCell, format: NumberFormat): bigint | string {
  if (cell instanceof Date) return `Book value ${quote(dateToIsoDate(cell) ?? "")} is a date, not a number`;
  const text = typeof cell === "number" ? (numberToPlainDecimal(cell) ?? "") : (cell ?? "");
  const result = parseAmountToCents(text, typeof cell === "number" ? "dot-decimal" : format);
  if (result.ok) return result.cents;
  return result.kind === "blank" ? "Book value is blank" : `Book value ${quote(text)} ${result.detail}`;
}

/** ISO date, null for a blank cell, "" for a cell that is not a date. */
function readDate(cell: RawCell, m: CompiledMapping): string | null {
  if (cell === null || (typeof cell === "string" && cell.trim() === "")) return null;
  const iso =
    cell instanceof Date
      ? dateToIsoDate(cell)
      : typeof cell === "number"
        ? excelSerialToIsoDate(cell, m.date1904)
        : parseDateText(cell, m.dateOrder);
  return iso ?? "";
}

function badDateReason(cell: RawCell, m: CompiledMapping): string {
  const order = m.dateOrder === "day-first" ? "DD/MM/YYYY" : "MM/DD/YYYY";
  return `Date ${quote(cellText(cell))} is not a valid date (expected YYYY-MM-DD or ${order})`;
}
