import ExcelJS from "exceljs";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { SourceRow } from "@/lib/imports/source-row";
import { XLSX_BATCH_ROWS, readXlsxRows, readXlsxRowsForLoad } from "@/lib/imports/xlsx-rows";
import { fillLedger } from "./ledger-workbook";

// The reference is exceljs 4.4's own streaming WorkbookReader (readXlsxRows): the full load's
// fast reader must give the very rows, cell for cell (dates, formulas' cached results, booleans,
// errors, shared and inline strings), and hand over to exceljs where it cannot read.
const dir = mkdtempSync(path.join(tmpdir(), "sondage-full-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const file = (name: string) => path.join(dir, name);

async function all(rows: AsyncGenerator<{ rows: SourceRow[] }>): Promise<SourceRow[]> {
  const out: SourceRow[] = [];
  for await (const batch of rows) out.push(...batch.rows);
  return out;
}

beforeAll(async () => {
  const shared = new ExcelJS.Workbook();
  fillLedger(shared.addWorksheet("Receivables"), 3 * XLSX_BATCH_ROWS + 17, (i) => i % 3 === 0);
  fillLedger(shared.addWorksheet("Short"), 5, () => false);
  await shared.xlsx.writeFile(file("shared.xlsx"));

  // Inline strings; one rich inline string (which the fast reader leaves to exceljs) well after the first batch.
  const streamed = new ExcelJS.stream.xlsx.WorkbookWriter({
    filename: file("inline.xlsx"),
    useSharedStrings: false,
    useStyles: true,
  });
  fillLedger(streamed.addWorksheet("Late"), XLSX_BATCH_ROWS + 700, (i) => i === XLSX_BATCH_ROWS + 500);
  await streamed.commit();
}, 120_000);

describe("full XLSX load reader", () => {
  it("reads every row of a shared-strings workbook exactly as exceljs does, in batches, without falling back", async () => {
    const reasons: string[] = [];
    const batches: number[] = [];
    const fast: SourceRow[] = [];
    for await (const batch of readXlsxRowsForLoad(file("shared.xlsx"), "Receivables", (r) => reasons.push(r))) {
      batches.push(batch.rows.length);
      fast.push(...batch.rows);
    }
    expect(reasons).toEqual([]);
    expect(batches.length).toBeGreaterThan(1);
    expect(batches.slice(0, -1).every((n) => n >= XLSX_BATCH_ROWS)).toBe(true); // streamed, a batch at a time
    expect(fast).toHaveLength(3 * XLSX_BATCH_ROWS + 18);
    expect(fast).toEqual(await all(readXlsxRows(file("shared.xlsx"), "Receivables")));
  }, 60_000);

  it("reads a short sheet the same way", async () => {
    expect(await all(readXlsxRowsForLoad(file("shared.xlsx"), "Short"))).toEqual(
      await all(readXlsxRows(file("shared.xlsx"), "Short")),
    );
  }, 60_000);

  it("hands over to exceljs from the row after the last one given when it meets what it cannot read", async () => {
    const reasons: string[] = [];
    const rows = await all(readXlsxRowsForLoad(file("inline.xlsx"), "Late", (r) => reasons.push(r)));
    expect(reasons).toHaveLength(1); // the rich run (<r>) inside an inline string
    const reference = await all(readXlsxRows(file("inline.xlsx"), "Late"));
    expect(rows.map((r) => r.rowNumber)).toEqual(reference.map((r) => r.rowNumber));
    expect(rows).toEqual(reference);
  }, 60_000);

  it("passes a refusal through rather than retrying it with exceljs", async () => {
    await expect(all(readXlsxRowsForLoad(file("shared.xlsx"), "Missing"))).rejects.toThrow(/no sheet named "Missing"/);
  });
});
