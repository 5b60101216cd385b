import "server-only";
import { numberToPlainDecimal } from "./number-format";
import { dateToIsoDate } from "./dates";

/** A cell as the source gives it: CSV gives text only; XLSX also numbers and dates. */
export type RawCell = string | number | Date | null;

export interface SourceRow {
  /** 1-based row number as the user sees it in Excel or a text editor. */
  rowNumber: number;
  cells: RawCell[];
}

export interface SourceBatch {
  rows: SourceRow[];
  /** Rows the parser itself could not read cleanly (CSV quoting). */
  quoteProblems: { rowNumber: number; reason: string }[];
  /** Bytes of the file read so far. */
  bytesRead: number;
}

/** A cell as text, as a spreadsheet shows it: numbers plainly, dates as YYYY-MM-DD. */
export function cellText(cell: RawCell): string {
  if (cell === null) return "";
  if (typeof cell === "string") return cell;
  if (typeof cell === "number") return numberToPlainDecimal(cell) ?? String(cell);
  return dateToIsoDate(cell) ?? "";
}

export function isBlankSourceRow(cells: readonly RawCell[]): boolean {
  for (const cell of cells) {
    if (cell !== null && (typeof cell !== "string" || cell.trim() !== "")) return false;
  }
  return true;
}
