import "server-only";
import Papa from "papaparse";

export type Delimiter = "," | ";" | "\t" | "|";
export type Newline = "\r\n" | "\n" | "\r";
export const DELIMITERS: readonly Delimiter[] = [",", ";", "\t", "|"];

export interface CsvChunkResult {
  rows: string[][];
  /** Index into `rows` of each malformed-quote problem papaparse reported. */
  quoteErrors: { rowIndex: number; message: string }[];
  /** Characters of the input consumed; the rest is an unfinished row. */
  consumed: number;
}

interface PapaRawResult {
  data: string[][];
  errors: { type: string; code: string; message: string; row?: number }[];
  meta: { cursor: number };
}

/**
 * RFC 4180 parsing (fields in double quotes may hold the delimiter, line breaks and "" for a quote,
 * RFC 4180 §2 rules 5–7) through papaparse's core Parser, fed chunk by chunk. With `more` set the
 * last, possibly cut-off row is left unconsumed so the caller can prepend it to the next chunk.
 */
export function parseCsvChunk(text: string, delimiter: Delimiter, newline: Newline, more: boolean): CsvChunkResult {
  const parser = new Papa.Parser({ delimiter, newline, quoteChar: '"', escapeChar: '"' });
  const result = parser.parse(text, 0, more) as PapaRawResult;
  return {
    rows: result.data,
    quoteErrors: result.errors
      .filter((error) => error.type === "Quotes" && error.row !== undefined)
      .map((error) => ({ rowIndex: error.row ?? 0, message: error.message })),
    consumed: more ? result.meta.cursor : text.length,
  };
}

/** The first line break in the text decides: CRLF, LF or a lone CR. */
export function detectNewline(text: string): Newline {
  const lf = text.indexOf("\n");
  if (lf > 0 && text[lf - 1] === "\r") return "\r\n";
  if (lf >= 0) return "\n";
  return text.includes("\r") ? "\r" : "\n";
}

/**
 * The delimiter that splits the first 50 non-blank rows into the most rows sharing one field count
 * above 1 (common practice, as spreadsheet import wizards do). Ties go to comma, semicolon, tab, pipe.
 */
export function detectDelimiter(text: string, newline: Newline, more: boolean): Delimiter {
  let best: Delimiter = ",";
  let bestScore = 0;
  for (const delimiter of DELIMITERS) {
    const rows = parseCsvChunk(text, delimiter, newline, more)
      .rows.filter((row) => row.some((cell) => cell.trim() !== ""))
      .slice(0, 50);
    const counts = new Map<number, number>();
    for (const row of rows) counts.set(row.length, (counts.get(row.length) ?? 0) + 1);
    let score = 0;
    for (const [fields, count] of counts) if (fields > 1) score = Math.max(score, count * 1000 + fields);
    if (score > bestScore) {
      best = delimiter;
      bestScore = score;
    }
  }
  return best;
}
