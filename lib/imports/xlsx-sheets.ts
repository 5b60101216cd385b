import "server-only";
import { listZipEntries } from "@/lib/files/zip";
import { readZipEntry } from "./zip-entry-stream";

const WORKBOOK_PART = "xl/workbook.xml";

/** Whether a zip archive holds an Excel workbook part (the part exceljs reads). */
export async function hasWorkbookPart(filePath: string): Promise<boolean> {
  const entries = await listZipEntries(filePath);
  return entries !== null && entries.some((entry) => entry.name === WORKBOOK_PART);
}

export interface WorkbookInfo {
  sheets: string[];
  /** The workbook counts dates from 1904 (workbookPr date1904, ECMA-376 Part 1, §18.2.28). */
  date1904: boolean;
}

/**
 * Sheet names in tab order, read from xl/workbook.xml's <sheets> list (ECMA-376 Part 1, §18.2.19
 * sheet) without streaming the worksheets themselves.
 */
export async function readWorkbookInfo(filePath: string): Promise<WorkbookInfo> {
  const entries = await listZipEntries(filePath);
  const part = entries?.find((entry) => entry.name === WORKBOOK_PART);
  if (!part) return { sheets: [], date1904: false };
  const xml = (await readZipEntry(filePath, part)).toString("utf8");
  const date1904 = /<(?:\w+:)?workbookPr\b[^>]*\bdate1904\s*=\s*["'](1|true)["']/.test(xml);
  const names: string[] = [];
  for (const tag of xml.matchAll(/<(?:\w+:)?sheet\b[^>]*>/g)) {
    const name = /\bname\s*=\s*("([^"]*)"|'([^']*)')/.exec(tag[0]);
    if (name) names.push(decodeXmlText(name[2] ?? name[3] ?? ""));
  }
  return { sheets: names, date1904 };
}

function decodeXmlText(text: string): string {
  return text.replace(/&(#x[0-9a-f]+|#\d+|amp|lt|gt|quot|apos);/gi, (_, entity: string) => {
    const lower = entity.toLowerCase();
    if (lower.startsWith("#x")) return String.fromCodePoint(parseInt(lower.slice(2), 16));
    if (lower.startsWith("#")) return String.fromCodePoint(parseInt(lower.slice(1), 10));
    return { amp: "&", lt: "<", gt: ">", quot: '"', apos: "'" }[lower] ?? "";
  });
}
