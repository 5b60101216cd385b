import "server-only";
import { formatCents } from "./amount";
import type { ValidatedRow } from "./row-validator";

/**
 * Lines for MariaDB `LOAD DATA LOCAL INFILE` with its default field options
 * (FIELDS TERMINATED BY '\t' ESCAPED BY '\\' LINES TERMINATED BY '\n'): backslash, tab, newline,
 * carriage return and NUL are written as \\ \t \n \r \0, and NULL as \N
 * (MariaDB Knowledge Base, "LOAD DATA INFILE": escape sequences and \N for NULL).
 */
export const LOAD_DATA_COLUMNS = ["row_number", "item_ref", "description", "book_value", "item_date", "extra"] as const;

/** The field/line clause matching the lines written here; keep CHARACTER SET utf8mb4 beside it. */
export const LOAD_DATA_FORMAT_CLAUSE =
  "CHARACTER SET utf8mb4 FIELDS TERMINATED BY '\\t' ESCAPED BY '\\\\' LINES TERMINATED BY '\\n'";

export const LOAD_DATA_NULL = "\\N";

const SPECIAL = /[\\\t\n\r\0]/g;
const HAS_SPECIAL = /[\\\t\n\r\0]/;
const ESCAPES: Record<string, string> = { "\\": "\\\\", "\t": "\\t", "\n": "\\n", "\r": "\\r", "\0": "\\0" };

export function escapeLoadDataField(value: string | null): string {
  if (value === null) return LOAD_DATA_NULL;
  return HAS_SPECIAL.test(value) ? value.replace(SPECIAL, (ch) => ESCAPES[ch]) : value;
}

const UNESCAPES: Record<string, string> = { "0": "\0", b: "\b", n: "\n", r: "\r", t: "\t", Z: "\x1a" };

/** How the server reads one field back (for tests and diagnostics). */
export function unescapeLoadDataField(field: string): string | null {
  if (field === LOAD_DATA_NULL) return null;
  return field.replace(/\\(.)/gs, (_, ch: string) => UNESCAPES[ch] ?? ch);
}

export function rowToLoadDataLine(row: ValidatedRow): string {
  return (
    `${row.rowNumber}\t${escapeLoadDataField(row.itemRef)}\t${escapeLoadDataField(row.description)}\t` +
    `${formatCents(row.bookValueCents)}\t${row.date ?? LOAD_DATA_NULL}\t` +
    `${row.extra === null ? LOAD_DATA_NULL : escapeLoadDataField(JSON.stringify(row.extra))}\n`
  );
}
