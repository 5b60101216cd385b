import "server-only";
import { AppError } from "@/lib/errors";

/** One reason a workbook row cannot be applied; `row` is the sheet's row number, `column` the header. */
export interface WorkbookProblem {
  row: number | null;
  column: string | null;
  /** The cell address ("E7") when the problem is in one cell. */
  cell?: string;
  reason: string;
}

/** A workbook refused as a whole: 422 with every problem found, nothing applied. */
export class WorkbookProblemsError extends AppError {
  constructor(
    readonly problems: WorkbookProblem[],
    message?: string,
  ) {
    const rows = new Set(problems.map((p) => p.row)).size;
    super(
      422,
      "workbook_rejected",
      message ??
        `The workbook was not imported: ${problems.length} problem${problems.length === 1 ? "" : "s"} in ${rows} row${rows === 1 ? "" : "s"}. Nothing was changed; correct the rows listed and import again.`,
    );
  }

  toResponse(): Response {
    return Response.json(
      { error: { code: this.code, message: this.message, problems: this.problems } },
      { status: this.status },
    );
  }
}
