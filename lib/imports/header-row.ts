import "server-only";
import { parseAmountToCents } from "./amount";
import { parseDateText } from "./dates";
import { ImportError } from "./import-error";

export interface TextRow {
  rowNumber: number;
  cells: string[];
}

export interface HeaderRow {
  /** 1-based row number of the header as the user sees it. */
  headerRow: number;
  headers: string[];
  /** Names given to blank (or merged-away) header cells, e.g. "Column C". */
  autoNamedColumns: string[];
  /** Number of fields in the header row as written (CSV rows must all have this many). */
  fieldCount: number;
}

const MAX_TITLE_ROWS = 5;

/** Spreadsheet column letters: 0 → A, 25 → Z, 26 → AA. */
export function columnLetter(index: number): string {
  let n = index + 1;
  let letters = "";
  while (n > 0) {
    const rem = (n - 1) % 26;
    letters = String.fromCharCode(65 + rem) + letters;
    n = Math.floor((n - 1) / 26);
  }
  return letters;
}

export function isBlankRow(cells: readonly string[]): boolean {
  return cells.every((cell) => cell.trim() === "");
}

function looksLikeValue(cell: string): boolean {
  return (
    parseAmountToCents(cell, "dot-decimal").ok ||
    parseAmountToCents(cell, "comma-decimal").ok ||
    parseDateText(cell, "day-first") !== null ||
    parseDateText(cell, "month-first") !== null
  );
}

/**
 * Finds the header: the first non-blank row, after at most 5 one-cell title lines (a report
 * title above the table). It must look like labels (fewer than half its cells read as numbers or
 * dates), else the file is refused with "no header row". Blank header cells between labels, which is
 * also how a merged header cell arrives, are named after their column letter ("Column C");
 * trailing blank header cells are dropped. Repeated names (ignoring case and spaces) are refused.
 */
export function findHeaderRow(rows: readonly TextRow[]): HeaderRow {
  const filled = rows.filter((row) => !isBlankRow(row.cells));
  if (filled.length === 0) throw new ImportError("empty-file", "The file has no rows with values.");
  const nonBlankCount = (row: TextRow) => row.cells.filter((cell) => cell.trim() !== "").length;
  let at = 0;
  while (at < MAX_TITLE_ROWS && at < filled.length - 1 && nonBlankCount(filled[at]) === 1) at += 1;
  const candidate = filled[at];
  const labels = candidate.cells.filter((cell) => cell.trim() !== "");
  if (labels.length < 2) {
    throw new ImportError(
      "no-header-row",
      `Row ${candidate.rowNumber} has only one column. A population needs at least an item reference and a book value column; check the file's separator.`,
    );
  }
  const valueLike = labels.filter(looksLikeValue).length;
  if (valueLike * 2 >= labels.length) {
    const sample = labels
      .slice(0, 3)
      .map((cell) => `"${cell.trim()}"`)
      .join(", ");
    throw new ImportError(
      "no-header-row",
      `No header row: row ${candidate.rowNumber} looks like data (${sample}). Add a first row naming the columns, e.g. Reference, Amount.`,
    );
  }
  return { headerRow: candidate.rowNumber, fieldCount: candidate.cells.length, ...nameColumns(candidate.cells) };
}

function nameColumns(cells: readonly string[]): Pick<HeaderRow, "headers" | "autoNamedColumns"> {
  let width = cells.length;
  while (width > 0 && cells[width - 1].trim() === "") width -= 1;
  const headers: string[] = [];
  const autoNamedColumns: string[] = [];
  const seen = new Map<string, number>();
  for (let i = 0; i < width; i += 1) {
    let name = cells[i].trim().replace(/\s+/g, " ");
    if (name === "") {
      name = `Column ${columnLetter(i)}`;
      autoNamedColumns.push(name);
    }
    const key = name.toLowerCase();
    const earlier = seen.get(key);
    if (earlier !== undefined) {
      throw new ImportError(
        "duplicate-header",
        `The header "${name}" appears in both column ${columnLetter(earlier)} and column ${columnLetter(i)}; rename one so every column has its own name.`,
      );
    }
    seen.set(key, i);
    headers.push(name);
  }
  return { headers, autoNamedColumns };
}
