import ExcelJS from "exceljs";
import { describe, expect, it } from "vitest";
import { countDataRowsWithinLimit } from "@/lib/imports/count-data-rows";
import { ImportError } from "@/lib/imports/import-error";
import { inspectUpload } from "@/lib/imports/inspect-upload";
import { PopulationImport } from "@/lib/imports/population-import";
import { populationMappingSchema } from "@/lib/validation/population-mapping";
import { fixtureFolder } from "./temp-files";

const write = fixtureFolder();
const mapping = populationMappingSchema.parse({ itemRefColumn: "Invoice", bookValueColumn: "Amount" });

async function count(file: string, maxRows: number) {
  return countDataRowsWithinLimit(file, await inspectUpload(file), maxRows);
}

async function refusal(promise: Promise<unknown>): Promise<ImportError> {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(ImportError);
  return error as ImportError;
}

// The reference is the load's own pass (PopulationImport.summary().rowsRead): the upload's count
// must agree with it, so a file the count lets through is never refused by the load for its rows.
describe("countDataRowsWithinLimit", () => {
  const csv = [
    "Ledger export FY2024",
    "",
    "Invoice,Amount,Note",
    "INV-1,10.00,plain",
    "",
    ",,",
    'INV-2,20.00,"two',
    'lines"',
    "INV-3,30.00,last",
  ].join("\n");

  it("counts the rows after the header row, skipping blank ones and keeping a quoted line break in its row, as the load does", async () => {
    const file = write("preamble.csv", csv);
    const inspection = await inspectUpload(file);
    expect(inspection.headerRow).toBe(3);
    const load = new PopulationImport(file, inspection, mapping);
    const summary = await load.validateOnly();
    expect(await count(file, 10)).toBe(summary.rowsRead);
    expect(summary.rowsRead).toBe(3);
  });

  it("accepts a file with exactly the limit", async () => {
    expect(await count(write("exact.csv", csv), 3)).toBe(3);
  });

  it("stops at the first row beyond the limit, naming the limit and the file's row (413)", async () => {
    const error = await refusal(count(write("over.csv", csv), 2));
    expect(error.reason).toBe("too-many-rows");
    expect(error.status).toBe(413);
    // Data row 3 is INV-3, the file's row 8 (the quoted field's line break keeps INV-2 one row, row 7).
    expect(error.message).toBe(
      "Row 8 is data row 3: a population holds at most 2 data rows. Split the file and import each part.",
    );
  });

  it("counts a workbook's inspected sheet the same way", async () => {
    const workbook = new ExcelJS.Workbook();
    const sheet = workbook.addWorksheet("Receivables");
    sheet.addRow(["Invoice", "Amount"]);
    for (let i = 1; i <= 5; i += 1) sheet.addRow([`INV-${i}`, i * 10]);
    sheet.addRow([]);
    sheet.addRow(["INV-6", 60]);
    const file = write("ledger.xlsx", new Uint8Array(await workbook.xlsx.writeBuffer()));
    expect(await count(file, 6)).toBe(6);
    expect((await refusal(count(file, 5))).message).toMatch(
      /^Row 8 is data row 6: a population holds at most 5 data rows/,
    );
  });

  it("reads a workbook's rows only up to their first value and still counts as the load does: blank text, empty formula results, a value only in the last column", async () => {
    const workbook = new ExcelJS.Workbook();
    const sheet = workbook.addWorksheet("Receivables");
    sheet.addRow(["Invoice", "Amount", "Note"]);
    sheet.addRow(["INV-1", 10, "first"]);
    sheet.addRow(["  ", "", " "]); // blank text only: not a data row
    sheet.addRow([{ formula: '""', result: "" }, null, null]); // an empty formula result: blank
    sheet.addRow([null, null, "late"]); // a value in the last column only: a data row
    sheet.addRow([" ", { formula: "1+1", result: 2 }, null]); // blank text, then a number
    sheet.addRow([{ richText: [{ text: " " }, { text: "" }] }, null, null]); // blank rich text: blank
    sheet.addRow([{ error: "#N/A" }, null, null]); // an error cell holds its code: a data row
    sheet.addRow(["INV-8", 80, null]);
    const file = write("blank-forms.xlsx", new Uint8Array(await workbook.xlsx.writeBuffer()));
    const inspection = await inspectUpload(file);
    const summary = await new PopulationImport(file, inspection, mapping).validateOnly();
    expect(summary.rowsRead).toBe(5);
    expect(await countDataRowsWithinLimit(file, inspection, 10)).toBe(summary.rowsRead);
  });
});
