import "server-only";

// OWASP "CSV Injection": a cell whose text begins with = + - @, a tab or a carriage return may be
// read as a formula by a spreadsheet program when the cell is edited or the file is re-saved.
const FORMULA_TRIGGER = /^[=+\-@\t\r]/;

/**
 * Text for a workbook cell that can never run as a formula: written as a string and, when it begins
 * with a formula trigger, prefixed with an apostrophe (the OWASP guidance), so it stays text even
 * after someone edits the cell.
 */
export function safeCellText(value: string | null | undefined): string {
  if (value === null || value === undefined) return "";
  return FORMULA_TRIGGER.test(value) ? `'${value}` : value;
}

/** The text as it was before `safeCellText`: an apostrophe we added in front of a trigger is removed. */
export function unescapeCellText(value: string): string {
  return value.length > 1 && value[0] === "'" && FORMULA_TRIGGER.test(value.slice(1)) ? value.slice(1) : value;
}
