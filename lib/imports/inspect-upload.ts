import "server-only";
import type { NumberFormat } from "./amount";
import { detectDelimiter, detectNewline, parseCsvChunk, type Delimiter, type Newline } from "./csv-parser";
import { readCsvHead } from "./csv-rows";
import { detectDateOrder, type DateOrder } from "./dates";
import { findHeaderRow, isBlankRow, type TextRow } from "./header-row";
import { ImportError } from "./import-error";
import { MAX_COLUMNS, PREVIEW_BYTES, PREVIEW_ROWS, resolveLimits, type ImportLimits } from "./limits";
import { detectNumberFormat } from "./number-format";
import { sniffFile, type TextEncoding } from "./sniff-file";
import { cellText } from "./source-row";
import { readWorkbookInfo } from "./xlsx-sheets";
import { listZipEntries } from "@/lib/files/zip";
import { assertEntriesWithinLimits, assertZipInflationWithinLimits } from "./zip-limits";
import { readXlsxHeadRows } from "./xlsx-fast-rows";
import { XLSX_BATCH_ROWS, readXlsxRows } from "./xlsx-rows";
import { formatCount } from "@/lib/format/number";

/** What the column-mapping screen needs; plain JSON, so it can be stored between requests. */
export interface UploadInspection {
  kind: "csv" | "xlsx";
  size: number;
  encoding?: TextEncoding;
  delimiter?: Delimiter;
  newline?: Newline;
  /** XLSX: every sheet in tab order, and the one inspected. */
  sheets?: string[];
  sheet?: string;
  date1904?: boolean;
  headerRow: number;
  headers: string[];
  autoNamedColumns: string[];
  /** CSV: the field count every row must have; null for XLSX. */
  headerFieldCount: number | null;
  /** The first 20 data rows as text, one cell per header. */
  preview: string[][];
  previewRowNumbers: number[];
  /** Most common format over the columns that decide one; null when nothing decides. */
  detectedNumberFormat: NumberFormat | null;
  columnNumberFormats: (NumberFormat | null)[];
  detectedDateOrder: DateOrder | null;
  /** Data rows counted at upload (the whole file, within the row limit); absent on uploads received before the count. */
  dataRows?: number;
}

const SAMPLE_ROWS = 500;

/** Reads only the head of an upload (256 KB of a CSV; the first rows of a sheet) to describe it. */
export async function inspectUpload(
  filePath: string,
  options: { sheet?: string; limits?: Partial<ImportLimits> } = {},
): Promise<UploadInspection> {
  const sniff = await sniffFile(filePath, resolveLimits(options.limits));
  if (sniff.kind === "xlsx") {
    const entries = (await listZipEntries(filePath)) ?? [];
    assertEntriesWithinLimits(entries);
    if (!options.sheet) await assertZipInflationWithinLimits(filePath, entries); // once, at upload; a re-inspection of another sheet skips it
    return inspectWorkbook(filePath, sniff.size, options.sheet);
  }
  const { text, truncated } = await readCsvHead(filePath, sniff.encoding, PREVIEW_BYTES);
  const newline = detectNewline(text);
  const delimiter = detectDelimiter(text, newline, truncated);
  const rows = parseCsvChunk(text, delimiter, newline, truncated).rows.map((cells, i) => ({ rowNumber: i + 1, cells }));
  return {
    kind: "csv",
    size: sniff.size,
    encoding: sniff.encoding,
    delimiter,
    newline,
    ...describeRows(rows, !truncated, true),
  };
}

async function inspectWorkbook(filePath: string, size: number, wanted: string | undefined): Promise<UploadInspection> {
  const { sheets, date1904 } = await readWorkbookInfo(filePath);
  const sheet = wanted ?? sheets[0];
  if (sheet === undefined || !sheets.includes(sheet)) {
    throw new ImportError(
      "sheet-not-found",
      `The workbook has no sheet named "${wanted ?? ""}". Its sheets are: ${sheets.join(", ")}.`,
    );
  }
  const fast = await readHeadRowsFast(filePath, sheet);
  if (fast)
    return { kind: "xlsx", size, sheets, sheet, date1904, ...describeRows(fast, fast.length < SAMPLE_ROWS, false) };
  const rows: TextRow[] = [];
  let complete = true;
  for await (const batch of readXlsxRows(filePath, sheet)) {
    for (const row of batch.rows) rows.push({ rowNumber: row.rowNumber, cells: row.cells.map(cellText) });
    if (rows.length >= SAMPLE_ROWS) {
      complete = false;
      break;
    }
  }
  return { kind: "xlsx", size, sheets, sheet, date1904, ...describeRows(rows, complete, false) };
}

/**
 * The rows the exceljs path would sample (its first batch of XLSX_BATCH_ROWS rows), read by the
 * fast head reader; null when that reader meets anything it does not understand.
 */
export async function readHeadRowsFast(filePath: string, sheet: string): Promise<TextRow[] | null> {
  try {
    const rows = await readXlsxHeadRows(filePath, sheet, XLSX_BATCH_ROWS);
    return rows.map((row) => ({ rowNumber: row.rowNumber, cells: row.cells.map(cellText) }));
  } catch (err) {
    if (err instanceof ImportError) throw err; // a refusal (e.g. a zip bomb), not an unknown construct
    return null;
  }
}

function describeRows(rows: TextRow[], complete: boolean, isCsv: boolean) {
  const header = findHeaderRow(rows);
  if (header.headers.length > MAX_COLUMNS) {
    throw new ImportError(
      "too-many-columns",
      `Row ${header.headerRow} has ${formatCount(header.headers.length)} columns; a ledger may have at most ${MAX_COLUMNS}. Remove the columns you do not need and upload again.`,
    );
  }
  const data = rows.filter((row) => row.rowNumber > header.headerRow && !isBlankRow(row.cells));
  if (data.length === 0 && complete) {
    throw new ImportError("header-only", `The file has a header row (row ${header.headerRow}) but no data rows.`);
  }
  const width = header.headers.length;
  const column = (index: number) => data.map((row) => row.cells[index] ?? "");
  const columnNumberFormats = header.headers.map((_, index) => detectNumberFormat(column(index)));
  const decided = columnNumberFormats.filter((format): format is NumberFormat => format !== null);
  const commaColumns = decided.filter((format) => format === "comma-decimal").length;
  const preview = data.slice(0, PREVIEW_ROWS);
  return {
    headerRow: header.headerRow,
    headers: header.headers,
    autoNamedColumns: header.autoNamedColumns,
    headerFieldCount: isCsv ? header.fieldCount : null,
    preview: preview.map((row) => Array.from({ length: width }, (_, i) => row.cells[i] ?? "")),
    previewRowNumbers: preview.map((row) => row.rowNumber),
    detectedNumberFormat:
      decided.length === 0
        ? null
        : commaColumns * 2 > decided.length
          ? ("comma-decimal" as const)
          : ("dot-decimal" as const),
    columnNumberFormats,
    detectedDateOrder: detectDateOrder(data.flatMap((row) => row.cells)),
  };
}
