import "server-only";
import { readCsvRows } from "./csv-rows";
import { ImportError } from "./import-error";
import type { UploadInspection } from "./inspect-upload";
import { isBlankSourceRow, type SourceBatch } from "./source-row";
import { readXlsxRowsForLoad } from "./xlsx-rows";
import { formatCount } from "@/lib/format/number";

/**
 * Counts the data rows of an inspected upload (non-blank rows after the header row, as the load
 * counts them) with the load's own readers, and stops at the first row beyond `maxRows`: that file
 * is refused at once, naming the limit and the row, before anything is stored — rather than after
 * a load has written a million rows and rolled them back. Returns the count when within the limit.
 */
export async function countDataRowsWithinLimit(
  filePath: string,
  inspection: UploadInspection,
  maxRows: number,
): Promise<number> {
  let count = 0;
  for await (const batch of sourceOf(filePath, inspection)) {
    for (const row of batch.rows) {
      if (row.rowNumber <= inspection.headerRow || isBlankSourceRow(row.cells)) continue;
      count += 1;
      if (count > maxRows) {
        throw new ImportError(
          "too-many-rows",
          `Row ${formatCount(row.rowNumber)} is data row ${formatCount(count)}: a population holds at most ${formatCount(maxRows)} data rows. Split the file and import each part.`,
        );
      }
    }
  }
  return count;
}

function sourceOf(filePath: string, inspection: UploadInspection): AsyncGenerator<SourceBatch> {
  // A row counts when it has one non-blank cell: the workbook reader reads each row only that far.
  if (inspection.kind === "xlsx")
    return readXlsxRowsForLoad(filePath, inspection.sheet ?? "", undefined, { untilFirstValue: true });
  if (!inspection.encoding || !inspection.delimiter || !inspection.newline) {
    throw new ImportError("invalid-mapping", "The inspection of this CSV is incomplete; inspect the file again.");
  }
  return readCsvRows(filePath, {
    encoding: inspection.encoding,
    delimiter: inspection.delimiter,
    newline: inspection.newline,
  });
}
