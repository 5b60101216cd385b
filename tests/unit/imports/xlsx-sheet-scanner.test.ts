import ExcelJS from "exceljs";
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { listZipEntries, type ZipEntry } from "@/lib/files/zip";
import type { SourceRow } from "@/lib/imports/source-row";
import type { PendingRow } from "@/lib/imports/xlsx-cell-values";
import { SheetRowParser } from "@/lib/imports/xlsx-fast-rows";
import { readWorkbookParts, type WorkbookParts } from "@/lib/imports/xlsx-parts";
import { XLSX_BATCH_ROWS, readXlsxRows, readXlsxRowsForLoad } from "@/lib/imports/xlsx-rows";
import { SheetScanner } from "@/lib/imports/xlsx-sheet-scanner";
import { UnsupportedXlsxError } from "@/lib/imports/xml-tokens";
import { readZipEntry, streamZipEntryText } from "@/lib/imports/zip-entry-stream";
import { buildZip } from "../../integration/support/zip-builder";
import { fillLedger } from "./ledger-workbook";

// The reference is the general tokenizer's parser (SheetRowParser), itself checked cell for cell
// against exceljs 4.4's streaming reader in xlsx-full-load.test.ts; the handover test checks
// against exceljs directly.
const dir = mkdtempSync(path.join(tmpdir(), "sondage-scanner-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const file = (name: string) => path.join(dir, name);

interface Read {
  rows: PendingRow[];
  finished: boolean;
  lastShared: number;
}
type Parser = { lastShared: number; finished: boolean; pushText(text: string, out: PendingRow[]): void };

function readInChunks(parser: Parser, text: string, chunk: number): Read {
  const rows: PendingRow[] = [];
  for (let at = 0; at < text.length && !parser.finished; at += chunk) parser.pushText(text.slice(at, at + chunk), rows);
  return { rows, finished: parser.finished, lastShared: parser.lastShared };
}

let ledger: { parts: WorkbookParts; text: string };

async function sheetText(workbook: string, sheet: string) {
  const parts = await readWorkbookParts(workbook, sheet);
  let text = "";
  for await (const chunk of streamZipEntryText(workbook, parts.entries.get(parts.sheetPath)!)) text += chunk;
  return { parts, text };
}

beforeAll(async () => {
  const workbook = new ExcelJS.Workbook();
  fillLedger(workbook.addWorksheet("Receivables"), XLSX_BATCH_ROWS + 600, (i) => i % 3 === 0);
  await workbook.xlsx.writeFile(file("ledger.xlsx"));
  ledger = await sheetText(file("ledger.xlsx"), "Receivables");
}, 60_000);

/** A worksheet part around the given sheetData, for what spreadsheet programs seldom write. */
const worksheet = (sheetData: string) =>
  `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><dimension ref="A1:C5"/>${sheetData}<pageMargins left="0.7"/></worksheet>`;

describe("SheetScanner", () => {
  it("reads an exceljs workbook (shared strings, rich text, formulas, dates, booleans, errors) as the general parser does, however the text is cut", () => {
    const reference = readInChunks(new SheetRowParser(ledger.parts), ledger.text, ledger.text.length);
    expect(reference.rows).toHaveLength(XLSX_BATCH_ROWS + 601);
    for (const chunk of [ledger.text.length, 65_536, 4_093, 7, 1]) {
      expect(readInChunks(new SheetScanner(ledger.parts), ledger.text, chunk)).toEqual(reference);
    }
  });

  it("reads hand-written forms the same way: whitespace between rows and cells, single quotes, a > inside an attribute, entities, self-closing rows, cells and values, inline strings", () => {
    const text = worksheet(
      `<sheetData>
  <row r='1' spans="1:3" ht = "15">
    <c r="A1" t="s"><v>0</v></c> <c r="B1" t="inlineStr"><is><t xml:space="preserve"> Tom &amp; Jerry </t></is></c>
    <c r="C1" s="1" note="a>b"><v>45292</v></c>
  </row>
  <row r="3"/>
  <row r="4" s="1" customFormat="1"><c r="A4"/><c r="B4"><v>45300</v></c><c r="C4" t="str"><f>A1&amp;"x"</f><v>a&amp;amp;b</v></c></row>
  <row r="5"><c r="A5" t="inlineStr"><is/></c><c r="B5" t="str"><v/></c><c r="C5" t="b"><v>1</v></c><c r="D5" t="e"><v>#DIV/0!</v></c><c r="E5"><f t="shared" si="0"/><v>2.5</v></c></row>
</sheetData>`,
    );
    const reference = readInChunks(new SheetRowParser(ledger.parts), text, text.length);
    expect(reference.rows.map((row) => row.rowNumber)).toEqual([1, 3, 4, 5]);
    expect(reference.finished).toBe(true);
    for (const chunk of [text.length, 13, 2, 1]) {
      expect(readInChunks(new SheetScanner(ledger.parts), text, chunk)).toEqual(reference);
    }
  });

  it("finishes an empty sheetData with no rows", () => {
    expect(readInChunks(new SheetScanner(ledger.parts), worksheet("<sheetData/>"), 5)).toEqual({
      rows: [],
      finished: true,
      lastShared: -1,
    });
  });

  it.each([
    ["a namespace prefix", `<x:sheetData><x:row r="1"><x:c r="A1"><x:v>1</x:v></x:c></x:row></x:sheetData>`],
    ["a comment between rows", `<sheetData><row r="1"><c r="A1"><v>1</v></c></row><!-- checked --></sheetData>`],
    [
      "a rich run in an inline string",
      `<sheetData><row r="1"><c r="A1" t="inlineStr"><is><r><t>a</t></r></is></c></row></sheetData>`,
    ],
    ["text between a cell's elements", `<sheetData><row r="1"><c r="A1">\n<v>1</v>\n</c></row></sheetData>`],
    ["a cell without a reference", `<sheetData><row r="1"><c><v>1</v></c></row></sheetData>`],
    ["an element it does not know in a row", `<sheetData><row r="1"><extLst/></row></sheetData>`],
    ["an unquoted attribute", `<sheetData><row r=1><c r="A1"><v>1</v></c></row></sheetData>`],
  ])("leaves %s to the general parser (UnsupportedXlsxError)", (_, sheetData) => {
    expect(() => readInChunks(new SheetScanner(ledger.parts), worksheet(sheetData), 1_000)).toThrow(
      UnsupportedXlsxError,
    );
  });
});

describe("the full load's readers, one after the other", () => {
  /** The exceljs ledger rewritten part by part, read by the load's readers and by exceljs. */
  async function readRewritten(
    name: string,
    rewrite: (part: string, text: string) => string,
    order: (entries: ZipEntry[]) => ZipEntry[] = (entries) => entries,
  ) {
    const entries = order((await listZipEntries(file("ledger.xlsx")))!);
    const parts = await Promise.all(
      entries.map(async (entry) => {
        const data = await readZipEntry(file("ledger.xlsx"), entry);
        const text = data.toString("utf8");
        const rewritten = rewrite(entry.name, text);
        return { name: entry.name, data: rewritten === text ? data : Buffer.from(rewritten, "utf8") };
      }),
    );
    writeFileSync(file(name), buildZip(parts));
    const fallbacks: string[] = [];
    const rows: SourceRow[] = [];
    for await (const batch of readXlsxRowsForLoad(file(name), "Receivables", (why) => fallbacks.push(why)))
      rows.push(...batch.rows);
    const reference: SourceRow[] = [];
    for await (const batch of readXlsxRows(file(name), "Receivables")) reference.push(...batch.rows);
    return { fallbacks, rows, reference };
  }

  it("hands over from the scanner to the general parser mid-sheet, from the row after the last one given, without exceljs", async () => {
    // A comment (which the scanner leaves to the general parser) after row 2,300.
    let commented = false;
    const { fallbacks, rows, reference } = await readRewritten("commented.xlsx", (part, text) => {
      if (part !== ledger.parts.sheetPath) return text;
      commented = true;
      return text.replace('<row r="2301"', '<!-- checked --><row r="2301"');
    });
    expect(commented).toBe(true);
    expect(fallbacks).toEqual([]);
    expect(rows).toHaveLength(XLSX_BATCH_ROWS + 601);
    expect(rows).toEqual(reference);
  }, 60_000);

  it("leaves no temporary file behind when exceljs reads a sheet stored before the workbook's other parts", async () => {
    // exceljs parks such a sheet in a file of its own (tmp-<pid>-…) until it has read the workbook part.
    const parked = () => readdirSync(tmpdir()).filter((name) => name.startsWith(`tmp-${process.pid}-`));
    const before = parked();
    const sheetFirst = (entries: ZipEntry[]) => [
      ...entries.filter((entry) => entry.name === ledger.parts.sheetPath),
      ...entries.filter((entry) => entry.name !== ledger.parts.sheetPath),
    ];
    const { rows, reference } = await readRewritten("sheet-first.xlsx", (_, text) => text, sheetFirst);
    expect(reference).toHaveLength(XLSX_BATCH_ROWS + 601);
    expect(rows).toEqual(reference);
    // exceljs removes its file with an asynchronous unlink: give it a moment.
    await expect.poll(() => parked().filter((name) => !before.includes(name)), { timeout: 5_000 }).toEqual([]);
  }, 60_000);

  it("keeps the rows exceljs gave when a part stored after the wanted sheet cannot be inflated", async () => {
    const entries = (await listZipEntries(file("ledger.xlsx")))!;
    const parts = await Promise.all(
      entries.map(async (entry) => ({ name: entry.name, data: await readZipEntry(file("ledger.xlsx"), entry) })),
    );
    const junk = "xl/worksheets/sheet9.xml";
    // The workbook's other parts first, so exceljs streams the sheet at once; then the sheet; then the spoilt part.
    const sheet = (part: { name: string }) => part.name === ledger.parts.sheetPath;
    const zip = buildZip([
      ...parts.filter((part) => !sheet(part)),
      ...parts.filter(sheet),
      { name: junk, data: Buffer.from(ledger.text) },
    ]);
    // Spoil the last entry's deflated bytes, just after the name in its local header.
    const at = zip.indexOf(Buffer.from(junk)) + junk.length + 8;
    zip.fill(0xff, at, at + 64);
    writeFileSync(file("spoilt-tail.xlsx"), zip);
    const rows: SourceRow[] = [];
    for await (const batch of readXlsxRows(file("spoilt-tail.xlsx"), "Receivables")) rows.push(...batch.rows);
    expect(rows).toHaveLength(XLSX_BATCH_ROWS + 601);
  }, 60_000);

  it("reads shared strings laid out other ways (line breaks between items, a comment) as exceljs does", async () => {
    for (const [name, rewrite] of [
      ["strings-lines.xlsx", (text: string) => text.replaceAll("</si><si>", "</si>\n  <si>")],
      ["strings-comment.xlsx", (text: string) => text.replace("</si><si>", "</si><!-- checked --><si>")],
    ] as const) {
      let changed = false;
      const { fallbacks, rows, reference } = await readRewritten(name, (part, text) => {
        if (part !== "xl/sharedStrings.xml") return text;
        changed = rewrite(text) !== text;
        return rewrite(text);
      });
      expect(changed).toBe(true);
      expect(fallbacks).toEqual([]);
      expect(rows).toHaveLength(XLSX_BATCH_ROWS + 601);
      expect(rows).toEqual(reference);
    }
  }, 60_000);
});
