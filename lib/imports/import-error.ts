import "server-only";
import { AppError } from "@/lib/errors";

/** Why a whole file was refused (row-level problems are reported as RowProblem instead). */
export type ImportErrorReason =
  | "file-too-large"
  | "too-many-rows"
  | "empty-file"
  | "header-only"
  | "binary-file"
  | "unsupported-encoding"
  | "unsupported-format"
  | "not-a-workbook"
  | "sheet-not-found"
  | "no-header-row"
  | "duplicate-header"
  | "too-many-columns"
  | "invalid-mapping"
  | "unreadable-file";

const STATUS_BY_REASON: Record<ImportErrorReason, 400 | 413 | 422> = {
  "file-too-large": 413,
  "too-many-rows": 413,
  "empty-file": 422,
  "header-only": 422,
  "binary-file": 422,
  "unsupported-encoding": 422,
  "unsupported-format": 422,
  "not-a-workbook": 422,
  "sheet-not-found": 400,
  "no-header-row": 422,
  "duplicate-header": 422,
  "too-many-columns": 422,
  "invalid-mapping": 400,
  "unreadable-file": 422,
};

/**
 * A file refused as a whole; `message` is written for the person who uploaded it. It answers like
 * every other error, `{ error: { code, message } }`, with the reason as its code.
 */
export class ImportError extends AppError {
  declare readonly status: 400 | 413 | 422;

  constructor(
    readonly reason: ImportErrorReason,
    message: string,
  ) {
    super(STATUS_BY_REASON[reason], reason, message);
    this.name = "ImportError";
  }
}

export function isImportError(error: unknown): error is ImportError {
  return error instanceof ImportError;
}
