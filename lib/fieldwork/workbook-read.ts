import "server-only";
import ExcelJS from "exceljs";
import { AppError } from "@/lib/errors";
import { unescapeCellText } from "./cell-text";
import { columnsFor, ITEMS_SHEET, type ColumnKey, type WorkbookKind } from "./workbook-layout";
import { WorkbookProblemsError } from "./workbook-problems";
import { zipEntryNames } from "@/lib/files/zip";

export type SheetCell =
  | { kind: "empty" }
  | { kind: "number"; value: number }
  | { kind: "text"; value: string }
  | { kind: "boolean"; value: boolean }
  | { kind: "date"; value: Date }
  | { kind: "formula"; formula: string }
  | { kind: "error"; value: string };

export interface SheetRow {
  row: number;
  cells: Record<ColumnKey, SheetCell>;
}
export interface ColumnPlace {
  header: string;
  letter: string;
}
export interface ItemsSheet {
  rows: SheetRow[];
  columns: Record<ColumnKey, ColumnPlace>;
}

const EMPTY: SheetCell = { kind: "empty" };
/** Read-only columns a sheet may lack (a workbook exported before "Selected as" existed still imports). */
const OPTIONAL_COLUMNS = new Set<ColumnKey>(["order", "description", "selectedAs", "misstatement"]);

export function toSheetCell(value: ExcelJS.CellValue): SheetCell {
  if (value === null || value === undefined) return EMPTY;
  if (typeof value === "number") return { kind: "number", value };
  if (typeof value === "boolean") return { kind: "boolean", value };
  if (typeof value === "string") return value.trim() === "" ? EMPTY : { kind: "text", value: unescapeCellText(value) };
  if (value instanceof Date) return { kind: "date", value };
  if ("formula" in value || "sharedFormula" in value)
    return {
      kind: "formula",
      formula: String((value as { formula?: string }).formula ?? (value as { sharedFormula?: string }).sharedFormula),
    };
  if ("richText" in value) return toSheetCell(value.richText.map((r) => r.text).join(""));
  if ("hyperlink" in value) return toSheetCell(String(value.text ?? ""));
  if ("error" in value) return { kind: "error", value: String(value.error) };
  return EMPTY;
}

/** Refuses anything that is not an .xlsx by its content (zip magic and a workbook part), whatever its name. */
export async function assertXlsxContent(bytes: Uint8Array): Promise<void> {
  const names = await zipEntryNames(bytes);
  if (!names)
    throw new AppError(
      415,
      "not_a_workbook",
      "The file is not an Excel workbook (.xlsx): its content is not a zip package. Import the workbook exported from Sondage.",
    );
  if (!names.includes("xl/workbook.xml"))
    throw new AppError(
      415,
      "not_a_workbook",
      "The file is a zip archive but not an Excel workbook (.xlsx). Import the workbook exported from Sondage.",
    );
}

/** Reads the Items sheet of a fieldwork workbook: its columns found by header, each non-empty row's cells. */
export async function readItemsSheet(bytes: Buffer, kind: WorkbookKind): Promise<ItemsSheet> {
  await assertXlsxContent(bytes);
  const wb = new ExcelJS.Workbook();
  try {
    await wb.xlsx.load(bytes as unknown as ArrayBuffer);
  } catch {
    throw new AppError(
      422,
      "unreadable_workbook",
      "The workbook could not be read (it may be damaged or password-encrypted). Save it again as .xlsx and import it.",
    );
  }
  const ws = wb.getWorksheet(ITEMS_SHEET);
  if (!ws)
    throw new WorkbookProblemsError([
      {
        row: null,
        column: null,
        reason: `The workbook has no sheet named "${ITEMS_SHEET}". Import the workbook exported from Sondage for this sample.`,
      },
    ]);
  const byHeader = new Map<string, number>();
  ws.getRow(1).eachCell((cell, col) => byHeader.set(String(cell.text).trim().toLowerCase(), col));
  const columns = {} as Record<ColumnKey, ColumnPlace>;
  const numbers = {} as Record<ColumnKey, number>;
  const missing = [];
  for (const spec of columnsFor(kind)) {
    const col = byHeader.get(spec.header.toLowerCase());
    if (col === undefined) {
      if (!OPTIONAL_COLUMNS.has(spec.key))
        missing.push({
          row: 1,
          column: spec.header,
          reason: `The column "${spec.header}" is missing from the header row.`,
        });
      continue;
    }
    numbers[spec.key] = col;
    columns[spec.key] = { header: spec.header, letter: ws.getColumn(col).letter };
  }
  if (missing.length)
    throw new WorkbookProblemsError(
      missing,
      `The ${ITEMS_SHEET} sheet is not laid out as this sample's fieldwork workbook (${kind === "amounts" ? "audited values" : "deviations"}): ${missing.length} column${missing.length === 1 ? "" : "s"} missing. Nothing was changed.`,
    );
  const rows: SheetRow[] = [];
  ws.eachRow({ includeEmpty: false }, (row, rowNumber) => {
    if (rowNumber === 1) return;
    const cells = {} as Record<ColumnKey, SheetCell>;
    let any = false;
    for (const spec of columnsFor(kind)) {
      const col = numbers[spec.key];
      const cell = col === undefined || spec.key === "misstatement" ? EMPTY : toSheetCell(row.getCell(col).value);
      cells[spec.key] = cell;
      if (cell.kind !== "empty") any = true;
    }
    if (any) rows.push({ row: rowNumber, cells });
  });
  return { rows, columns };
}
