import { describe, expect, it } from "vitest";
import { ImportError } from "@/lib/imports/import-error";
import { inspectUpload } from "@/lib/imports/inspect-upload";
import { fixtureFolder } from "./temp-files";

const write = fixtureFolder();

async function refusal(promise: Promise<unknown>): Promise<ImportError> {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(ImportError);
  return error as ImportError;
}

const ledger = (d: string) =>
  [
    ["Invoice", "Customer", "Amount", "Date"],
    ["INV-1", "Atelier Brume", "1,204.50", "2024-01-31"],
    ["INV-2", "Verger Nord", "(80.00)", "2024-02-01"],
  ]
    .map((row) => row.join(d))
    .join("\r\n");

describe("inspectUpload (CSV)", () => {
  it.each([
    [",", "comma"],
    [";", "semicolon"],
    ["\t", "tab"],
    ["|", "pipe"],
  ])("detects the %s delimiter (%s)", async (delimiter, name) => {
    const text = delimiter === "," ? ledger(",").replace("1,204.50", '"1,204.50"') : ledger(delimiter);
    const inspection = await inspectUpload(write(`${name}.csv`, text));
    expect(inspection.delimiter).toBe(delimiter);
    expect(inspection.newline).toBe("\r\n");
    expect(inspection.headers).toEqual(["Invoice", "Customer", "Amount", "Date"]);
    expect(inspection.preview[0]).toEqual(["INV-1", "Atelier Brume", "1,204.50", "2024-01-31"]);
    expect(inspection.previewRowNumbers).toEqual([2, 3]);
    expect(inspection.headerRow).toBe(1);
    expect(inspection.columnNumberFormats[2]).toBe("dot-decimal");
  });

  it("previews only the first 20 data rows and detects comma-decimal amounts", async () => {
    const rows = Array.from({ length: 100 }, (_, i) => `R${i};${i},5${i % 10}`);
    const inspection = await inspectUpload(write("many.csv", `Ref;Montant\n${rows.join("\n")}\n`));
    expect(inspection.preview).toHaveLength(20);
    expect(inspection.preview[19]).toEqual(["R19", "19,59"]);
    expect(inspection.detectedNumberFormat).toBe("comma-decimal");
  });

  it("skips blank lines and a one-cell title line above the header", async () => {
    const inspection = await inspectUpload(
      write("titled.csv", "\nReceivables at 31 December 2024,,\nRef,Name,Amount\nA,B,1\n"),
    );
    expect(inspection.headerRow).toBe(3);
    expect(inspection.headers).toEqual(["Ref", "Name", "Amount"]);
  });

  it('reports "no header row" when the first row looks like data', async () => {
    const error = await refusal(
      inspectUpload(write("noheader.csv", "INV-1,1204.50,2024-01-31\nINV-2,80.00,2024-02-01\n")),
    );
    expect(error.reason).toBe("no-header-row");
    expect(error.message).toMatch(/^No header row: row 1 looks like data \("INV-1", "1204.50", "2024-01-31"\)/);
  });

  it("refuses a file with a header but no data rows", async () => {
    const error = await refusal(inspectUpload(write("header-only.csv", "Ref,Amount\r\n\r\n")));
    expect(error.reason).toBe("header-only");
    expect(error.message).toBe("The file has a header row (row 1) but no data rows.");
  });

  it("refuses a duplicated header, naming both columns", async () => {
    const error = await refusal(inspectUpload(write("dup.csv", "Ref,Amount,Name,amount\nA,1,B,2\n")));
    expect(error.reason).toBe("duplicate-header");
    expect(error.message).toMatch(/"amount" appears in both column B and column D/);
  });

  it("names a blank header cell after its column letter", async () => {
    const inspection = await inspectUpload(write("blank-header.csv", "Ref,,Amount\nA,x,1\n"));
    expect(inspection.headers).toEqual(["Ref", "Column B", "Amount"]);
    expect(inspection.autoNamedColumns).toEqual(["Column B"]);
  });
});
