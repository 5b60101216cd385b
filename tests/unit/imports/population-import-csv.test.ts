import { describe, expect, it } from "vitest";
import { ImportError } from "@/lib/imports/import-error";
import { inspectUpload } from "@/lib/imports/inspect-upload";
import { PopulationImport } from "@/lib/imports/population-import";
import type { RowProblem, ValidatedRow } from "@/lib/imports/row-validator";
import { unescapeLoadDataField } from "@/lib/imports/load-data-tsv";
import { populationMappingSchema, type PopulationMappingInput } from "@/lib/validation/population-mapping";
import { fixtureFolder } from "./temp-files";

const write = fixtureFolder();
const baseMapping: PopulationMappingInput = { itemRefColumn: "Invoice", bookValueColumn: "Amount" };

async function run(
  name: string,
  content: string | Buffer,
  mapping: PopulationMappingInput = baseMapping,
  maxRows?: number,
) {
  const file = write(name, content);
  const inspection = await inspectUpload(file);
  const job = new PopulationImport(
    file,
    inspection,
    populationMappingSchema.parse(mapping),
    maxRows ? { limits: { maxRows } } : {},
  );
  const rows: ValidatedRow[] = [];
  const problems: RowProblem[] = [];
  for await (const batch of job.batches()) {
    rows.push(...batch.rows);
    problems.push(...batch.problems);
  }
  return { rows, problems, summary: job.summary(), inspection };
}

describe("PopulationImport over CSV", () => {
  it("keeps quoted fields with commas, quotes and line breaks (RFC 4180 §2 rules 5–7)", async () => {
    const csv =
      'Invoice,Customer,Amount\r\nINV-1,"Brume, Atelier",12.00\r\nINV-2,"Line one\r\nline two ""quoted""","1,000.00"\r\nINV-3,Nord,3\r\n';
    const { rows, problems } = await run("quoted.csv", csv, { ...baseMapping, descriptionColumn: "Customer" });
    expect(problems).toEqual([]);
    expect(rows.map((r) => [r.rowNumber, r.description, r.bookValueCents])).toEqual([
      [2, "Brume, Atelier", 1200n],
      [3, 'Line one\r\nline two "quoted"', 100000n],
      [4, "Nord", 300n],
    ]);
  });

  it("totals in BigInt with positive, zero and negative counts", async () => {
    const csv = "Invoice,Amount\nA,9999999999999999.99\nB,9999999999999999.99\nC,0\nD,(10.01)\n";
    const { summary } = await run("totals.csv", csv);
    expect(summary.totals).toEqual({
      rowCount: 4,
      totalCents: 2n * 999999999999999999n - 1001n,
      positive: { count: 2, totalCents: 1999999999999999998n },
      zero: { count: 1 },
      negative: { count: 1, totalCents: -1001n },
    });
    expect(summary.rowsRead).toBe(4);
    expect(summary.problemCount).toBe(0);
  });

  it("reports each problem with the row number the user sees and the column", async () => {
    const csv = [
      "Invoice,Amount,Date",
      "A,12.00,2024-01-31",
      ",5.00,2024-01-31",
      "C,abc,2024-01-31",
      "D,1.234,2024-01-31",
      "E,99999999999999999,2024-01-31",
      "F,1.00,2024-02-30",
      "G,1.00",
      '"=HYPERLINK(""http://x.test"",""pay"")","=HYPERLINK(""http://x.test"",""9"")",2024-01-01',
      "",
      "J,7,31/01/2024",
    ].join("\n");
    const { rows, problems, summary } = await run("problems.csv", csv, { ...baseMapping, dateColumn: "Date" });
    expect(problems).toEqual([
      { row: 3, column: "Invoice", reason: "Item reference is blank" },
      { row: 4, column: "Amount", reason: 'Book value "abc" is not a number in the dot-decimal format' },
      { row: 5, column: "Amount", reason: 'Book value "1.234" has 3 decimal places; at most 2 are allowed' },
      {
        row: 6,
        column: "Amount",
        reason: 'Book value "99999999999999999" is larger than 9,999,999,999,999,999.99, the largest amount accepted',
      },
      { row: 7, column: "Date", reason: 'Date "2024-02-30" is not a valid date (expected YYYY-MM-DD or DD/MM/YYYY)' },
      { row: 8, column: null, reason: "Row has 2 fields; the header row has 3" },
      {
        row: 9,
        column: "Amount",
        reason: 'Book value "=HYPERLINK("http://x.test","9")" is not a number in the dot-decimal format',
      },
    ]);
    expect(rows.map((r) => [r.rowNumber, r.date])).toEqual([
      [2, "2024-01-31"],
      [11, "2024-01-31"],
    ]);
    expect(summary.rowsRead).toBe(9);
  });

  it("keeps a formula-looking cell as text, never evaluated", async () => {
    const csv = 'Invoice,Amount,Note\n"=HYPERLINK(""http://x.test"",""INV-9"")",5,@cmd\n';
    const { rows } = await run("formula.csv", csv, { ...baseMapping, extraColumns: ["Note"] });
    expect(rows[0].itemRef).toBe('=HYPERLINK("http://x.test","INV-9")');
    expect(rows[0].extra).toEqual({ Note: "@cmd" });
  });

  it("decodes Windows-1252 (0x80 = €, 0xE9 = é; CP1252.TXT) and reads comma decimals", async () => {
    const bytes = Buffer.concat([
      Buffer.from("Invoice;Libell"),
      Buffer.from([0xe9]),
      Buffer.from(";Amount\r\nF-1;Caf"),
      Buffer.from([0xe9]),
      Buffer.from(";1.234,56 "),
      Buffer.from([0x80]),
      Buffer.from("\r\n"),
    ]);
    const { rows, inspection } = await run("cp1252.csv", bytes, { ...baseMapping, descriptionColumn: "Libellé" });
    expect(inspection.encoding).toBe("windows-1252");
    expect(rows[0]).toMatchObject({ description: "Café", bookValueCents: 123456n });
  });

  it("lets the user override the detected number format", async () => {
    const { problems, rows } = await run("override.csv", 'Invoice,Amount\nA,"1,234"\n', {
      ...baseMapping,
      numberFormat: "comma-decimal",
    });
    expect(rows).toEqual([]);
    expect(problems[0].reason).toBe('Book value "1,234" has 3 decimal places; at most 2 are allowed');
  });

  it("stops at the row limit, naming it", async () => {
    const csv = `Invoice,Amount\n${Array.from({ length: 6 }, (_, i) => `R${i},1`).join("\n")}\n`;
    const error = await run("limit.csv", csv, baseMapping, 5).then(
      () => null,
      (e: unknown) => e,
    );
    expect(error).toBeInstanceOf(ImportError);
    expect((error as ImportError).status).toBe(413);
    expect((error as ImportError).message).toMatch(/more than 5 data rows/);
    await expect(run("at-limit.csv", csv, baseMapping, 6)).resolves.toMatchObject({ summary: { rowsRead: 6 } });
  });

  it("keeps the first problems in detail and counts the rest", async () => {
    const file = write(
      "many-bad.csv",
      `Invoice,Amount\n${Array.from({ length: 30 }, (_, i) => `R${i},x`).join("\n")}\n`,
    );
    const job = new PopulationImport(file, await inspectUpload(file), populationMappingSchema.parse(baseMapping), {
      limits: { maxProblemDetails: 10 },
    });
    const summary = await job.validateOnly();
    expect(summary.problemCount).toBe(30);
    expect(summary.problems).toHaveLength(10);
    expect(summary.problemsTruncated).toBe(true);
  });

  it("streams a file larger than one read chunk, with progress, and emits LOAD DATA lines", async () => {
    const count = 40_000;
    const lines = Array.from(
      { length: count },
      (_, i) => `INV-${i},"Client ${i}\tA\\B",${i}.${String(i % 100).padStart(2, "0")}`,
    );
    const file = write("large.csv", `Invoice,Customer,Amount\n${lines.join("\n")}\n`);
    const progress: number[][] = [];
    const job = new PopulationImport(
      file,
      await inspectUpload(file),
      populationMappingSchema.parse({ ...baseMapping, descriptionColumn: "Customer" }),
      {
        onProgress: (rowsRead, bytesRead, totalBytes) => progress.push([rowsRead, bytesRead, totalBytes]),
      },
    );
    let tsv = "";
    for await (const chunk of job.toLoadDataStream()) tsv += String(chunk);
    const out = tsv.trimEnd().split("\n");
    expect(out).toHaveLength(count);
    expect(out[7].split("\t").map(unescapeLoadDataField)).toEqual(["9", "INV-7", "Client 7\tA\\B", "7.07", null, null]);
    expect(job.summary().totals.totalCents).toBe(BigInt(lines.reduce((sum, _, i) => sum + i * 100 + (i % 100), 0)));
    expect(progress.length).toBeGreaterThan(2);
    expect(progress.at(-1)).toEqual([count, progress.at(-1)?.[2], progress.at(-1)?.[2]]);
  });
});
