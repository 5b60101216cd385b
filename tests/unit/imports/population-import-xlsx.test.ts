import ExcelJS from "exceljs";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ImportError } from "@/lib/imports/import-error";
import { inspectUpload } from "@/lib/imports/inspect-upload";
import { PopulationImport } from "@/lib/imports/population-import";
import type { ValidatedRow } from "@/lib/imports/row-validator";
import { populationMappingSchema } from "@/lib/validation/population-mapping";

const dir = mkdtempSync(path.join(tmpdir(), "sondage-xlsx-"));
const file = path.join(dir, "ledger.xlsx");
afterAll(() => rmSync(dir, { recursive: true, force: true }));

beforeAll(async () => {
  const workbook = new ExcelJS.Workbook();
  const notes = workbook.addWorksheet("Notes");
  notes.addRow(["Prepared by", "Client staff"]);
  notes.addRow(["Period", "FY2024"]);

  const ledger = workbook.addWorksheet("Receivables");
  ledger.addRow(["Invoice", "Customer", "Amount", "", "Posted", "Region"]);
  ledger.mergeCells("C1:D1"); // "Amount" merged across C and D
  ledger.addRow([
    "INV-1",
    { richText: [{ text: "Atelier " }, { text: "Brume", font: { bold: true } }] },
    1204.5,
    "EUR",
    new Date(Date.UTC(2024, 0, 31)),
    "North",
  ]);
  ledger.addRow(["INV-2", "Verger Nord", { formula: "C2*2", result: 2409 }, "EUR", 45292, "South"]);
  ledger.getCell("E3").numFmt = "yyyy-mm-dd";
  ledger.addRow(["INV-3", "Quai Ouest", { formula: "0.1+0.2", result: 0.30000000000000004 }, "EUR", 45293, "West"]);
  ledger.addRow([]);
  ledger.addRow(["INV-4", "Sel & Co", "(15.25)", "EUR", "2024-02-29", ""]);
  ledger.addRow([{ formula: '"INV-"&5', result: "INV-5" }, "Nord", "n/a", "EUR", 45293.5, "East"]);
  ledger.getCell("E4").numFmt = "dd/mm/yyyy";
  await workbook.xlsx.writeFile(file);
});

async function readAll(sheet?: string) {
  const inspection = await inspectUpload(file, { sheet });
  const mapping = populationMappingSchema.parse({
    itemRefColumn: "Invoice",
    bookValueColumn: "Amount",
    descriptionColumn: "Customer",
    dateColumn: "Posted",
    extraColumns: ["Column D", "Region"],
    sheet,
  });
  const job = new PopulationImport(file, inspection, mapping);
  const rows: ValidatedRow[] = [];
  for await (const batch of job.batches()) rows.push(...batch.rows);
  return { inspection, rows, summary: job.summary() };
}

describe("XLSX imports", () => {
  it("lists the sheets in tab order and inspects the first by default", async () => {
    const inspection = await inspectUpload(file);
    expect(inspection.kind).toBe("xlsx");
    expect(inspection.sheets).toEqual(["Notes", "Receivables"]);
    expect(inspection.sheet).toBe("Notes");
    expect(inspection.headers).toEqual(["Prepared by", "Client staff"]);
  });

  it("refuses a sheet that does not exist, listing those that do", async () => {
    const error = await inspectUpload(file, { sheet: "Payables" }).then(
      () => null,
      (e: unknown) => e,
    );
    expect(error).toBeInstanceOf(ImportError);
    expect((error as ImportError).message).toMatch(/no sheet named "Payables".*Notes, Receivables/);
  });

  it("names the merged-away header cell after its column and previews text", async () => {
    const { inspection } = await readAll("Receivables");
    expect(inspection.headers).toEqual(["Invoice", "Customer", "Amount", "Column D", "Posted", "Region"]);
    expect(inspection.autoNamedColumns).toEqual(["Column D"]);
    expect(inspection.preview[0]).toEqual(["INV-1", "Atelier Brume", "1204.5", "EUR", "2024-01-31", "North"]);
    expect(inspection.previewRowNumbers).toEqual([2, 3, 4, 6, 7]);
  });

  it("reads cached formula results, rich text, Excel dates and date-formatted serials", async () => {
    const { rows, summary } = await readAll("Receivables");
    expect(rows.map((r) => [r.rowNumber, r.itemRef, r.description, r.bookValueCents, r.date])).toEqual([
      [2, "INV-1", "Atelier Brume", 120450n, "2024-01-31"],
      // Serial 45292 = 2024-01-01 in Excel's 1900 date system (Microsoft Learn, "Date systems in Excel").
      [3, "INV-2", "Verger Nord", 240900n, "2024-01-01"],
      // A cached 0.30000000000000004 reads 0.3, as Excel shows it to 15 significant digits.
      [4, "INV-3", "Quai Ouest", 30n, "2024-01-02"],
      [6, "INV-4", "Sel & Co", -1525n, "2024-02-29"],
    ]);
    expect(rows[0].extra).toEqual({ "Column D": "EUR", Region: "North" });
    expect(rows[3].extra).toEqual({ "Column D": "EUR" });
    expect(summary.problems).toEqual([
      { row: 7, column: "Amount", reason: 'Book value "n/a" is not a number in the dot-decimal format' },
    ]);
  });

  it("refuses a mapping whose sheet differs from the inspected one", async () => {
    const inspection = await inspectUpload(file);
    const mapping = populationMappingSchema.parse({
      itemRefColumn: "Invoice",
      bookValueColumn: "Amount",
      sheet: "Receivables",
    });
    expect(() => new PopulationImport(file, inspection, mapping)).toThrow(/inspect the chosen sheet first/);
  });
});
