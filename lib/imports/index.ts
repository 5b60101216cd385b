import "server-only";
/**
 * Ledger imports: parse and validate an uploaded CSV or XLSX population, streaming.
 *
 *   const inspection = await inspectUpload(path, { sheet });        // reads only the head; throws ImportError
 *   // show inspection.headers / preview / detected formats; the user posts a PopulationMapping
 *   const mapping = populationMappingSchema.parse(body);            // lib/validation/population-mapping.ts
 *   const run = new PopulationImport(path, inspection, mapping, { onProgress: (rows, bytes, total) => … });
 *
 *   Validate only:  const summary = await run.validateOnly();
 *   Load in one pass (parse + validate + totals + TSV), inside a transaction:
 *     await conn.query({ sql: `LOAD DATA LOCAL INFILE 'stream' INTO TABLE population_items
 *       ${LOAD_DATA_FORMAT_CLAUSE} (${LOAD_DATA_COLUMNS.join(", ")}) SET population_id = ?`,
 *       values: [populationId], infileStreamFactory: () => run.toLoadDataStream() });
 *     const summary = run.summary();   // commit only if summary.problemCount === 0, else roll back
 *   Or iterate `run.batches()` for { rows: ValidatedRow[], problems: RowProblem[] }.
 *
 * Rows with problems are never emitted. Problems are { row, column, reason } with the row number the
 * user sees (header = row 1 normally); the first 10,000 are kept, all are counted; problemsToCsv()
 * makes the downloadable list. Whole-file refusals (size, row limit, empty, header only, binary,
 * encoding, no header, duplicate header) throw ImportError with status 400/413/422 and
 * toResponse(). A PopulationImport makes one pass; create a new one to read again.
 *
 * Header cells: blank or merged-away header cells between labels are auto-named after their column
 * letter ("Column C", listed in inspection.autoNamedColumns), since exceljs's streaming reader does not
 * report merged ranges; trailing blank header cells are dropped.
 */
export { ImportError, isImportError, type ImportErrorReason } from "./import-error";
export {
  DEFAULT_LIMITS,
  MAX_DATA_ROWS,
  MAX_PROBLEM_DETAILS,
  MAX_UPLOAD_BYTES,
  PREVIEW_ROWS,
  type ImportLimits,
} from "./limits";
export { inspectUpload, type UploadInspection } from "./inspect-upload";
export {
  PopulationImport,
  type PopulationBatch,
  type PopulationImportOptions,
  type PopulationSummary,
} from "./population-import";
export type { RowProblem, ValidatedRow } from "./row-validator";
export type { PopulationTotals } from "./population-totals";
export { formatCents, parseAmountToCents, type NumberFormat } from "./amount";
export { detectNumberFormat } from "./number-format";
export type { DateOrder } from "./dates";
export { LOAD_DATA_COLUMNS, LOAD_DATA_FORMAT_CLAUSE, escapeLoadDataField, rowToLoadDataLine } from "./load-data-tsv";
export { problemsToCsv } from "./problems-csv";
