import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { ImportError } from "@/lib/imports/import-error";
import { inspectUpload } from "@/lib/imports/inspect-upload";
import { PopulationImport } from "@/lib/imports/population-import";
import { populationMappingSchema } from "@/lib/validation/population-mapping";
import { generateLedgerCsv } from "@/tests/bench/generate-ledger";
import { fixtureFolder } from "./temp-files";

const write = fixtureFolder();
const mapping = populationMappingSchema.parse({ itemRefColumn: "Invoice", bookValueColumn: "Amount" });

async function summarise(file: string) {
  const job = new PopulationImport(file, await inspectUpload(file), mapping);
  return job.validateOnly();
}

describe("CSV edge cases", () => {
  it("drops the UTF-8 byte-order mark from the first header", async () => {
    const file = write(
      "bom.csv",
      Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from("Invoice,Amount\nA,1\n")]),
    );
    const inspection = await inspectUpload(file);
    expect(inspection.encoding).toBe("utf-8-bom");
    expect(inspection.headers[0]).toBe("Invoice");
    expect((await summarise(file)).totals.totalCents).toBe(100n);
  });

  it("refuses invalid UTF-8 found after the sniffed first 64 KB", async () => {
    const body = `Invoice,Amount\n${"A,1\n".repeat(30_000)}`;
    const file = write(
      "late-bad.csv",
      Buffer.concat([Buffer.from(body), Buffer.from([0x42, 0xc3, 0x28, 0x2c, 0x31, 0x0a])]),
    );
    const error = await summarise(file).then(
      () => null,
      (e: unknown) => e,
    );
    expect(error).toBeInstanceOf(ImportError);
    expect((error as ImportError).message).toMatch(/not valid UTF-8/);
  });

  it("reports a quoted field left open at the end of the file on its row", async () => {
    const summary = await summarise(write("open-quote.csv", 'Invoice,Amount\nA,1\n"B,2\nC,3\n'));
    expect(summary.problems[0]).toMatchObject({ row: 3, column: null });
    expect(summary.problems[0].reason).toMatch(/double quote/);
    expect(summary.totals.rowCount).toBe(1);
  });

  it("skips blank lines without renumbering the rows after them", async () => {
    const summary = await summarise(write("gaps.csv", "Invoice,Amount\r\n\r\nA,x\r\n,\r\nB,2\r\n"));
    expect(summary.problems).toEqual([
      { row: 3, column: "Amount", reason: 'Book value "x" is not a number in the dot-decimal format' },
    ]);
    expect(summary.rowsRead).toBe(2);
  });
});

describe("generateLedgerCsv (bench and demo data)", () => {
  it("writes the same invented ledger for a seed, which imports without problems", async () => {
    const first = write("gen-a.csv", "");
    const second = write("gen-b.csv", "");
    await generateLedgerCsv(first, 2_000, 7);
    await generateLedgerCsv(second, 2_000, 7);
    expect(readFileSync(first)).toEqual(readFileSync(second));
    const inspection = await inspectUpload(first);
    expect(inspection.headers).toEqual(["Invoice", "Customer", "Posted", "Due", "Amount", "Currency"]);
    const job = new PopulationImport(
      first,
      inspection,
      populationMappingSchema.parse({
        itemRefColumn: "Invoice",
        bookValueColumn: "Amount",
        descriptionColumn: "Customer",
        dateColumn: "Posted",
      }),
    );
    const summary = await job.validateOnly();
    expect(summary.problemCount).toBe(0);
    expect(summary.totals.rowCount).toBe(2_000);
    expect(summary.totals.negative.count).toBeGreaterThan(0);
    expect(summary.totals.zero.count).toBeGreaterThan(0);
  });
});
