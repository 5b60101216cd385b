import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { problemsToCsv } from "@/lib/imports/problems-csv";
import { populationMappingSchema } from "@/lib/validation/population-mapping";

describe("problemsToCsv", () => {
  it("writes Row, Column, Problem with RFC 4180 quoting and defuses formula-like cells (OWASP CSV Injection)", () => {
    const csv = problemsToCsv([
      { row: 4, column: "Amount", reason: 'Book value "1,5" is not a number' },
      { row: 9, column: "=cmd", reason: "Item reference is blank" },
      { row: 11, column: null, reason: "Row has 2 fields; the header row has 3" },
    ]);
    expect(csv.startsWith("\uFEFFRow,Column,Problem\r\n")).toBe(true);
    const parsed = Papa.parse<string[]>(csv.slice(1).trimEnd(), { newline: "\r\n" }).data;
    expect(parsed).toEqual([
      ["Row", "Column", "Problem"],
      ["4", "Amount", 'Book value "1,5" is not a number'],
      ["9", "'=cmd", "Item reference is blank"],
      ["11", "", "Row has 2 fields; the header row has 3"],
    ]);
  });

  it("says how many problems were left out", () => {
    const csv = problemsToCsv([{ row: 2, column: "Amount", reason: "Book value is blank" }], 12_001);
    expect(csv.trimEnd().split("\r\n").at(-1)).toBe(
      ",,12000 more problems not listed; fix the ones above and upload again",
    );
  });
});

describe("populationMappingSchema", () => {
  it("accepts a full mapping and turns empty optional selects into undefined", () => {
    const mapping = populationMappingSchema.parse({
      itemRefColumn: " Invoice ",
      bookValueColumn: "Amount",
      descriptionColumn: "",
      dateColumn: "Posted",
      extraColumns: ["Region"],
      numberFormat: "",
      dateOrder: "month-first",
      sheet: "Receivables",
    });
    expect(mapping).toEqual({
      itemRefColumn: "Invoice",
      bookValueColumn: "Amount",
      descriptionColumn: undefined,
      dateColumn: "Posted",
      extraColumns: ["Region"],
      numberFormat: undefined,
      dateOrder: "month-first",
      sheet: "Receivables",
    });
  });

  it("refuses one column in two roles, naming the field", () => {
    const result = populationMappingSchema.safeParse({
      itemRefColumn: "Ref",
      bookValueColumn: "ref",
      extraColumns: ["Ref"],
    });
    expect(result.success).toBe(false);
    const paths = result.error?.issues.map((issue) => issue.path.join("."));
    expect(paths).toEqual(["bookValueColumn", "extraColumns.0"]);
  });

  it("requires the item reference and book value columns and a known number format", () => {
    const result = populationMappingSchema.safeParse({ itemRefColumn: "", numberFormat: "swiss" });
    expect(result.success).toBe(false);
    expect(result.error?.issues.map((issue) => issue.path[0])).toEqual([
      "itemRefColumn",
      "bookValueColumn",
      "numberFormat",
    ]);
  });
});
