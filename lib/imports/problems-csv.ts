import "server-only";
import { safeCellText } from "@/lib/fieldwork/cell-text";
import type { RowProblem } from "./row-validator";

function csvField(value: string): string {
  // The one formula guard of every export (OWASP "CSV Injection"): lib/fieldwork/cell-text.ts.
  const safe = safeCellText(value);
  // RFC 4180 §2 rules 6–7: quote fields holding commas, quotes or line breaks; double inner quotes.
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/**
 * The downloadable problem list: a UTF-8 CSV (with BOM, so Excel reads the accents) of
 * Row, Column, Problem, in file order; a last line says when the list was cut short.
 */
export function problemsToCsv(problems: readonly RowProblem[], totalCount = problems.length): string {
  const lines = ["Row,Column,Problem"];
  for (const problem of problems) {
    lines.push([String(problem.row), problem.column ?? "", problem.reason].map(csvField).join(","));
  }
  if (totalCount > problems.length) {
    lines.push(
      ["", "", `${totalCount - problems.length} more problems not listed; fix the ones above and upload again`]
        .map(csvField)
        .join(","),
    );
  }
  return `\uFEFF${lines.join("\r\n")}\r\n`;
}
