import { describe, expect, it } from "vitest";
import { readPastedColumn } from "@/components/samples/paste-column";

// Clipboard text as spreadsheets put it there: rows end in CRLF (the last row too) and cells in a
// row are separated by tabs — the "text/plain" flavour of a copied range (common practice; it is
// what Excel, LibreOffice Calc and Google Sheets write).
describe("readPastedColumn", () => {
  it("reads one value per line and drops the trailing line break", () => {
    expect(readPastedColumn("100.00\r\n1,250.50\r\n0\r\n")).toEqual(["100.00", "1,250.50", "0"]);
  });

  it("leaves a single value to the browser's own paste", () => {
    expect(readPastedColumn("1250.00")).toBeNull();
    expect(readPastedColumn("1250.00\r\n")).toBeNull();
  });

  it("takes the first cell of each line when several columns were copied", () => {
    expect(readPastedColumn("10\tagreed\n20\tdifference\n")).toEqual(["10", "20"]);
  });

  it("reads accounting parentheses as a minus and drops currency symbols and spaces", () => {
    expect(readPastedColumn("(1,200.00)\n$ 35.10\n€\u00a07\n")).toEqual(["-1,200.00", "35.10", "7"]);
  });

  it("keeps blank lines and typing mistakes, for the server to name the row", () => {
    expect(readPastedColumn("5\n\nabc\n")).toEqual(["5", "", "abc"]);
  });
});
