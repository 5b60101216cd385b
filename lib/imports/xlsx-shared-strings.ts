import "server-only";
import type { ZipEntry } from "@/lib/files/zip";
import { xmlTokens } from "./xlsx-parts";
import { UnsupportedXlsxError } from "./xml-tokens";

/** A shared string as exceljs gives it: plain text, rich text runs, or null for an empty item. */
export type SharedString = string | { richText: { text: string }[] } | null;

// Elements that may appear inside <si> (ECMA-376 Part 1, §18.4.8) and change only formatting.
const RUN_PROPERTIES = new Set([
  "rPr",
  "b",
  "i",
  "u",
  "strike",
  "sz",
  "color",
  "rFont",
  "family",
  "charset",
  "scheme",
  "vertAlign",
  "outline",
  "shadow",
  "condense",
  "extend",
]);

/**
 * Reads xl/sharedStrings.xml items 0..lastIndex and stops inflating there. Phonetic runs
 * (rPh, phoneticPr), text outside <t> and mixed plain/run items are refused as unsupported.
 */
export async function readSharedStrings(filePath: string, entry: ZipEntry, lastIndex: number): Promise<SharedString[]> {
  const strings: SharedString[] = [];
  if (lastIndex < 0) return strings;
  let inItem = false;
  let inText = false;
  let text: string | null = null;
  let inRun = false;
  let plainCount = 0;
  let runs: { text: string }[] = [];
  for await (const tokens of xmlTokens(filePath, entry)) {
    for (const token of tokens) {
      if (token.kind === "text") {
        if (inText) text = (text ?? "") + token.text;
        else if (inItem && token.text !== "") throw new UnsupportedXlsxError("text outside <t>");
      } else if (token.kind === "open") {
        if (token.name === "si") {
          [inItem, inRun, plainCount, runs] = [true, false, 0, []];
        } else if (!inItem) continue;
        else if (token.name === "t") {
          [text, inText] = [null, !token.selfClosing];
          if (!inRun) plainCount += 1;
        } else if (token.name === "r") inRun = !token.selfClosing;
        else if (!RUN_PROPERTIES.has(token.name)) throw new UnsupportedXlsxError(`<${token.name}> in a shared string`);
        if (token.selfClosing) closeElement(token.name);
      } else closeElement(token.name);
      if (strings.length > lastIndex) return strings;
    }
  }
  return strings;

  function closeElement(name: string) {
    if (!inItem) return;
    if (name === "t") {
      inText = false;
      return;
    }
    if (name === "r") {
      runs.push({ text: text ?? "" });
      [text, inRun] = [null, false];
      return;
    }
    if (name !== "si") return;
    if (plainCount > 1 || (plainCount > 0 && runs.length > 0)) throw new UnsupportedXlsxError("mixed shared string");
    strings.push(runs.length > 0 ? { richText: runs } : text);
    inItem = false;
    text = null;
  }
}
