import "server-only";
import type { Cell, CellValue } from "exceljs";
import { dateToIsoDate, excelSerialToIsoDate, isDateNumberFormat } from "./dates";
import type { RawCell } from "./source-row";

type ResultValue = number | string | boolean | Date | { error: string } | undefined;

/**
 * One exceljs cell as a RawCell. Formula cells give their cached result (never evaluated; a
 * formula saved without a result, or whose result is an error, gives "=FORMULA" text so the
 * problem list can quote it). Rich text becomes plain text, hyperlinks their text, booleans
 * TRUE/FALSE, error cells their code (#N/A…). Date-formatted numbers become dates.
 */
export function normalizeCell(cell: Cell, date1904: boolean): RawCell {
  return normalizeValue(cell.value, cell.numFmt, date1904);
}

export function normalizeValue(value: CellValue, numFmt: string | undefined, date1904: boolean): RawCell {
  if (value === null || value === undefined) return null;
  if (typeof value === "string" || value instanceof Date) return value;
  if (typeof value === "number") return numberCell(value, numFmt, date1904);
  if (typeof value === "boolean") return value ? "TRUE" : "FALSE";
  if ("richText" in value) return value.richText.map((run) => run.text ?? "").join("");
  if ("error" in value) return value.error;
  if ("formula" in value || "sharedFormula" in value) {
    const formula =
      "formula" in value && value.formula ? value.formula : "sharedFormula" in value ? value.sharedFormula : "";
    return formulaResult(value.result, formula ?? "", numFmt, date1904);
  }
  if ("text" in value) {
    const text: unknown = value.text;
    if (typeof text === "string") return text;
    if (text && typeof text === "object" && "richText" in text)
      return normalizeValue(text as CellValue, numFmt, date1904);
  }
  return null;
}

function formulaResult(result: ResultValue, formula: string, numFmt: string | undefined, date1904: boolean): RawCell {
  if (result === undefined || (typeof result === "number" && Number.isNaN(result))) return `=${formula}`;
  if (typeof result === "object" && !(result instanceof Date)) return result.error;
  if (typeof result === "boolean") return result ? "TRUE" : "FALSE";
  if (typeof result === "number") return numberCell(result, numFmt, date1904);
  return result;
}

function numberCell(value: number, numFmt: string | undefined, date1904: boolean): RawCell {
  if (!isDateNumberFormat(numFmt)) return value;
  const iso = excelSerialToIsoDate(value, date1904);
  return iso === null ? value : new Date(`${iso}T00:00:00Z`);
}

/** Text for a preview cell. */
export function isoOrText(cell: RawCell): string {
  if (cell instanceof Date) return dateToIsoDate(cell) ?? "";
  return cell === null ? "" : String(cell);
}
