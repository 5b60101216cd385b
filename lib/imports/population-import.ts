import "server-only";
import { Readable } from "node:stream";
import type { PopulationMapping } from "@/lib/validation/population-mapping";
import { readCsvRows } from "./csv-rows";
import { ImportError } from "./import-error";
import type { UploadInspection } from "./inspect-upload";
import { resolveLimits, type ImportLimits } from "./limits";
import { rowToLoadDataLine } from "./load-data-tsv";
import { addToTotals, emptyTotals, type PopulationTotals } from "./population-totals";
import { compileMapping, validateRow, type CompiledMapping, type RowProblem, type ValidatedRow } from "./row-validator";
import { sniffFile } from "./sniff-file";
import { isBlankSourceRow, type SourceBatch } from "./source-row";
import { readXlsxRowsForLoad } from "./xlsx-rows";
import { formatCount } from "@/lib/format/number";

export interface PopulationImportOptions {
  limits?: Partial<ImportLimits>;
  /** Called once per batch (about every 64 KB of CSV or 2,000 XLSX rows). */
  onProgress?: (rowsRead: number, bytesRead: number, totalBytes: number) => void;
}

export interface PopulationBatch {
  rows: ValidatedRow[];
  problems: RowProblem[];
}

export interface PopulationSummary {
  headerRow: number;
  /** Data rows read, with or without problems (blank rows are skipped and not counted). */
  rowsRead: number;
  /** Totals of the rows without problems. */
  totals: PopulationTotals;
  problemCount: number;
  /** The first `maxProblemDetails` problems in file order. */
  problems: RowProblem[];
  problemsTruncated: boolean;
}

/**
 * One streaming pass over an inspected upload: parse, validate every row, total, and hand out
 * valid rows in batches (or as LOAD DATA lines). Rows with problems are never emitted, so a load
 * must be committed only when `summary().problemCount === 0`.
 */
export class PopulationImport {
  private readonly limits: ImportLimits;
  private readonly state: PopulationSummary;
  private started = false;

  constructor(
    private readonly filePath: string,
    private readonly inspection: UploadInspection,
    private readonly mapping: PopulationMapping,
    private readonly options: PopulationImportOptions = {},
  ) {
    this.limits = resolveLimits(options.limits);
    this.state = {
      headerRow: inspection.headerRow,
      rowsRead: 0,
      totals: emptyTotals(),
      problemCount: 0,
      problems: [],
      problemsTruncated: false,
    };
    if (mapping.sheet !== undefined && mapping.sheet !== inspection.sheet) {
      throw new ImportError(
        "invalid-mapping",
        `Sheet "${mapping.sheet}" was chosen but sheet "${inspection.sheet ?? ""}" was inspected; inspect the chosen sheet first.`,
      );
    }
  }

  /** Totals and problems so far; final once the pass has ended. */
  summary(): PopulationSummary {
    return this.state;
  }

  async *batches(): AsyncGenerator<PopulationBatch> {
    if (this.started) throw new Error("A PopulationImport makes one pass; create another to read again.");
    this.started = true;
    const { size } = await sniffFile(this.filePath, this.limits);
    const compiled = this.compile();
    const { inspection, state, limits } = this;
    let headerSeen = false;
    for await (const batch of this.source()) {
      const problems: RowProblem[] = batch.quoteProblems.map(({ rowNumber, reason }) => ({
        row: rowNumber,
        column: null,
        reason,
      }));
      const quoted = new Set(batch.quoteProblems.map((problem) => problem.rowNumber));
      const rows: ValidatedRow[] = [];
      for (const row of batch.rows) {
        if (row.rowNumber < inspection.headerRow) continue;
        if (row.rowNumber === inspection.headerRow) {
          headerSeen = true;
          continue;
        }
        if (isBlankSourceRow(row.cells)) continue;
        state.rowsRead += 1;
        if (state.rowsRead > limits.maxRows) {
          throw new ImportError(
            "too-many-rows",
            `The file has more than ${formatCount(limits.maxRows)} data rows, the most accepted in one population. Split it and import each part.`,
          );
        }
        const valid = quoted.has(row.rowNumber) ? null : validateRow(row, compiled, problems);
        if (valid) {
          addToTotals(state.totals, valid.bookValueCents);
          rows.push(valid);
        }
      }
      this.record(problems);
      this.options.onProgress?.(state.rowsRead, batch.bytesRead, size);
      yield { rows, problems };
    }
    if (!headerSeen)
      throw new ImportError(
        "invalid-mapping",
        "The file changed since it was inspected: its header row is missing. Upload it again.",
      );
    if (state.rowsRead === 0)
      throw new ImportError("header-only", `The file has a header row (row ${inspection.headerRow}) but no data rows.`);
  }

  /** Validate-only pass: reads everything, stores nothing, returns the summary. */
  async validateOnly(): Promise<PopulationSummary> {
    for await (const batch of this.batches()) void batch;
    return this.state;
  }

  /** The same pass as tab-separated lines for MariaDB LOAD DATA (see load-data-tsv.ts). */
  async *loadDataChunks(): AsyncGenerator<string> {
    for await (const batch of this.batches()) {
      let chunk = "";
      for (const row of batch.rows) chunk += rowToLoadDataLine(row);
      if (chunk !== "") yield chunk;
    }
  }

  toLoadDataStream(): Readable {
    return Readable.from(this.loadDataChunks(), { objectMode: false });
  }

  private record(problems: RowProblem[]): void {
    const { state, limits } = this;
    state.problemCount += problems.length;
    const room = limits.maxProblemDetails - state.problems.length;
    if (problems.length > room) state.problemsTruncated = true;
    for (let i = 0; i < Math.min(room, problems.length); i += 1) state.problems.push(problems[i]);
  }

  private compile(): CompiledMapping {
    const { inspection, mapping } = this;
    const index = inspection.headers.findIndex(
      (header) => header.toLowerCase() === mapping.bookValueColumn.toLowerCase(),
    );
    return compileMapping(inspection.headers, mapping, {
      numberFormat:
        mapping.numberFormat ??
        inspection.columnNumberFormats[index] ??
        inspection.detectedNumberFormat ??
        "dot-decimal",
      dateOrder: mapping.dateOrder ?? inspection.detectedDateOrder ?? "day-first",
      fieldCount: inspection.headerFieldCount,
      date1904: inspection.date1904 === true,
    });
  }

  private source(): AsyncGenerator<SourceBatch> {
    const { inspection, filePath } = this;
    if (inspection.kind === "xlsx") return readXlsxRowsForLoad(filePath, inspection.sheet ?? "");
    if (!inspection.encoding || !inspection.delimiter || !inspection.newline) {
      throw new ImportError("invalid-mapping", "The inspection of this CSV is incomplete; inspect the file again.");
    }
    return readCsvRows(filePath, {
      encoding: inspection.encoding,
      delimiter: inspection.delimiter,
      newline: inspection.newline,
    });
  }
}
