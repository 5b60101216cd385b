import { describe, expect, it } from "vitest";
import { fileFactsView } from "@/components/populations/file-facts-view";
import type { UploadView } from "@/components/populations/upload-file";
import type { UploadInspection } from "@/lib/imports/inspect-upload";

const inspection = (extra: Partial<UploadInspection>): UploadInspection => ({
  kind: "csv",
  size: 39_428_315,
  encoding: "utf-8",
  delimiter: ",",
  headerRow: 1,
  headers: ["Reference", "Description", "Amount", "Date", "Account"],
  autoNamedColumns: [],
  headerFieldCount: 5,
  preview: [],
  previewRowNumbers: [],
  detectedNumberFormat: null,
  columnNumberFormats: [],
  detectedDateOrder: null,
  ...extra,
});
const upload = (extra: Partial<UploadInspection>): UploadView => ({
  id: 7,
  fileName: "ledger.csv",
  sizeBytes: 39_428_315,
  sha256: "5952c03fa993e6c3f9ced11c4e18a47b10b687fbc16908b3cb70ac257f133a0e",
  inspection: inspection(extra),
});

// common practice: the auditor compares the file's row count with the ledger's own before loading it.
describe("the upload's file facts", () => {
  it("shows the data rows counted at upload, grouped, between the size and the columns", () => {
    expect(fileFactsView(upload({ dataRows: 1_000_000 })).facts).toEqual([
      "CSV, UTF-8, comma-separated",
      "38 MB",
      "1,000,000 data rows",
      "5 columns",
    ]);
  });

  it("says one data row in the singular", () => {
    expect(fileFactsView(upload({ dataRows: 1 })).facts).toContain("1 data row");
  });

  it("shows no count for an upload received before rows were counted", () => {
    expect(fileFactsView(upload({})).facts).toEqual(["CSV, UTF-8, comma-separated", "38 MB", "5 columns"]);
  });

  it("names a workbook and shortens the SHA-256", () => {
    const view = fileFactsView(upload({ kind: "xlsx", encoding: undefined, delimiter: undefined, dataRows: 0 }));
    expect(view.facts[0]).toBe("Excel workbook");
    expect(view.facts).toContain("0 data rows");
    expect(view.sha256Short).toBe("5952c03fa993e6c3…");
  });
});
