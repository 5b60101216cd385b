import "server-only";
import { listZipEntries, type ZipEntry } from "@/lib/files/zip";
import { streamZipEntryText } from "./zip-entry-stream";
import { UnsupportedXlsxError, XmlTokenizer, type XmlToken } from "./xml-tokens";

// Built-in number formats by id (ECMA-376 Part 1, §18.8.30), as exceljs 4.4 reads them; ids
// 27–36 and 50–58 are locale-dependent and exceljs gives them no format, so neither do we.
const BUILT_IN_FORMATS: Record<number, string> = {
  0: "General",
  1: "0",
  2: "0.00",
  3: "#,##0",
  4: "#,##0.00",
  9: "0%",
  10: "0.00%",
  11: "0.00E+00",
  12: "# ?/?",
  13: "# ??/??",
  14: "mm-dd-yy",
  15: "d-mmm-yy",
  16: "d-mmm",
  17: "mmm-yy",
  18: "h:mm AM/PM",
  19: "h:mm:ss AM/PM",
  20: "h:mm",
  21: "h:mm:ss",
  22: 'm/d/yy "h":mm',
  37: "#,##0 ;(#,##0)",
  38: "#,##0 ;[Red](#,##0)",
  39: "#,##0.00 ;(#,##0.00)",
  40: "#,##0.00 ;[Red](#,##0.00)",
  45: "mm:ss",
  46: "[h]:mm:ss",
  47: "mmss.0",
  48: "##0.0E+0",
  49: "@",
};

/** Tokens of one zip entry, chunk by chunk; stop iterating to stop inflating. */
export async function* xmlTokens(filePath: string, entry: ZipEntry): AsyncGenerator<XmlToken[]> {
  const tokenizer = new XmlTokenizer();
  for await (const text of streamZipEntryText(filePath, entry)) yield tokenizer.push(text);
  if (tokenizer.pending.trim() !== "") throw new UnsupportedXlsxError(`${entry.name}: cut short`);
}

async function readAllTokens(filePath: string, entry: ZipEntry): Promise<XmlToken[]> {
  const all: XmlToken[] = [];
  for await (const tokens of xmlTokens(filePath, entry)) all.push(...tokens);
  return all;
}

export interface WorkbookParts {
  entries: Map<string, ZipEntry>;
  /** Zip path of the named sheet's worksheet part. */
  sheetPath: string;
  /** workbookPr date1904="1" (ECMA-376 Part 1, §18.2.28), read as exceljs reads it. */
  date1904: boolean;
  /** Number format of each cellXfs style id (§18.8.10), undefined when it has none. */
  styleFormats: (string | undefined)[];
}

/**
 * Finds a sheet's part through xl/workbook.xml (§18.2.19 sheet r:id) and
 * xl/_rels/workbook.xml.rels, and reads the style formats. Only the layout exceljs's streaming
 * reader itself understands (parts named worksheets/sheetN.xml) is accepted, so both paths
 * always read the same sheet.
 */
export async function readWorkbookParts(filePath: string, sheetName: string): Promise<WorkbookParts> {
  const list = await listZipEntries(filePath);
  if (!list) throw new UnsupportedXlsxError("not a zip");
  const entries = new Map(list.map((entry) => [entry.name, entry]));
  const part = (name: string) => {
    const entry = entries.get(name);
    if (!entry) throw new UnsupportedXlsxError(`no ${name}`);
    return entry;
  };
  const workbook = await readAllTokens(filePath, part("xl/workbook.xml"));
  const rels = await readAllTokens(filePath, part("xl/_rels/workbook.xml.rels"));
  const targets = new Map<string, string>();
  for (const token of rels) {
    if (token.kind === "open" && token.name === "Relationship") targets.set(token.attrs.Id, token.attrs.Target);
  }
  const sheetTargets = [...targets.values()].filter((target) => /^worksheets\/sheet\d+\.xml$/.test(target ?? ""));
  const sheetParts = list.filter((entry) => /^xl\/worksheets\/sheet\d+\.xml$/.test(entry.name));
  if (sheetParts.some((entry) => !sheetTargets.includes(entry.name.slice(3))))
    throw new UnsupportedXlsxError("worksheet without relationship");
  const sheet = workbook.find(
    (token) => token.kind === "open" && token.name === "sheet" && token.attrs.name === sheetName,
  );
  if (!sheet || sheet.kind !== "open" || sheetName.includes("&")) throw new UnsupportedXlsxError("sheet not resolved");
  const target = targets.get(sheet.attrs["r:id"] ?? "");
  if (!target || !sheetTargets.includes(target)) throw new UnsupportedXlsxError("sheet target not understood");
  const properties = workbook.find((token) => token.kind === "open" && token.name === "workbookPr");
  const date1904 = properties?.kind === "open" && properties.attrs.date1904 === "1";
  const styles = entries.get("xl/styles.xml");
  return {
    entries,
    sheetPath: `xl/${target}`,
    date1904,
    styleFormats: styles ? await readStyleFormats(filePath, styles) : [],
  };
}

async function readStyleFormats(filePath: string, entry: ZipEntry): Promise<(string | undefined)[]> {
  const custom = new Map<number, string>();
  const formats: (string | undefined)[] = [];
  const path: string[] = [];
  for (const token of await readAllTokens(filePath, entry)) {
    if (token.kind === "close") path.pop();
    if (token.kind !== "open") continue;
    const parent = path[path.length - 1];
    if (token.name === "numFmt" && parent === "numFmts") {
      custom.set(parseInt(token.attrs.numFmtId, 10), (token.attrs.formatCode ?? "").replace(/[\\](.)/g, "$1"));
    }
    if (token.name === "xf" && parent === "cellXfs") {
      const id = parseInt(token.attrs.numFmtId, 10);
      formats.push(id ? custom.get(id) || BUILT_IN_FORMATS[id] || undefined : undefined);
    }
    if (!token.selfClosing) path.push(token.name);
  }
  return formats;
}
