import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { escapeLoadDataField, rowToLoadDataLine, unescapeLoadDataField } from "@/lib/imports/load-data-tsv";

// MariaDB Knowledge Base, "LOAD DATA INFILE": with ESCAPED BY '\\' the sequences \0 \b \n \r \t \Z
// and \\ stand for NUL, backspace, newline, return, tab, Ctrl-Z and a backslash; a field \N is NULL.
describe("LOAD DATA escaping", () => {
  it.each([
    ["plain", "plain"],
    ["tab\there", "tab\\there"],
    ["line\nbreak", "line\\nbreak"],
    ["cr\r\nlf", "cr\\r\\nlf"],
    ["back\\slash", "back\\\\slash"],
    ["nul\0byte", "nul\\0byte"],
    ["\\N", "\\\\N"],
    ["C:\\new\\table", "C:\\\\new\\\\table"],
  ])("escapes %j as %j and reads it back", (value, escaped) => {
    expect(escapeLoadDataField(value)).toBe(escaped);
    expect(unescapeLoadDataField(escaped)).toBe(value);
  });

  it("writes NULL as \\N, distinct from the text \\N", () => {
    expect(escapeLoadDataField(null)).toBe("\\N");
    expect(unescapeLoadDataField("\\N")).toBeNull();
    expect(unescapeLoadDataField(escapeLoadDataField("\\N"))).toBe("\\N");
  });

  it("round-trips any string, and an escaped field never holds a raw tab, newline or return", () => {
    fc.assert(
      fc.property(
        fc.string({ unit: fc.constantFrom("a", "é", "€", "\\", "\t", "\n", "\r", "\0", "N", " ", '"') }),
        (value) => {
          const escaped = escapeLoadDataField(value);
          expect(escaped).not.toMatch(/[\t\n\r\0]/);
          expect(unescapeLoadDataField(escaped)).toBe(value);
        },
      ),
    );
  });

  it("lays out one row as six tab-separated fields ending in a newline", () => {
    const line = rowToLoadDataLine({
      rowNumber: 12,
      itemRef: "INV\t7",
      description: null,
      bookValueCents: -123456n,
      date: "2024-01-31",
      extra: { Note: 'a\\b "c"\nd' },
    });
    expect(line.endsWith("\n")).toBe(true);
    const fields = line.slice(0, -1).split("\t");
    expect(fields).toHaveLength(6);
    expect(fields.map(unescapeLoadDataField)).toEqual([
      "12",
      "INV\t7",
      null,
      "-1234.56",
      "2024-01-31",
      JSON.stringify({ Note: 'a\\b "c"\nd' }),
    ]);
  });
});
