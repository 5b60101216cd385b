import "server-only";
import type { ZipEntry } from "@/lib/files/zip";
import { UnsupportedXlsxError, XmlTokenizer, decodeXmlEntities, type XmlToken } from "./xml-tokens";
import { streamZipEntryText } from "./zip-entry-stream";

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
 * Each `<si>…</si>` is read on its own: a plain `<si><t>text</t></si>` straight from the text, any
 * other through the XML tokenizer. Anything between items but whitespace (a comment, say) is left
 * to the tokenizer over the whole part.
 */
export async function readSharedStrings(filePath: string, entry: ZipEntry, lastIndex: number): Promise<SharedString[]> {
  const strings: SharedString[] = [];
  if (lastIndex < 0) return strings;
  let rest = "";
  let items = false;
  for await (const chunk of streamZipEntryText(filePath, entry)) {
    const text = rest + chunk;
    let at = 0;
    for (;;) {
      const open = text.indexOf("<si", at);
      if (open < 0) break; // the rest waits for the next chunk
      if (items ? text.slice(at, open).trim() !== "" : !PART_START.test(text.slice(0, open)))
        return readSharedStringsByTokens(filePath, entry, lastIndex);
      items = true;
      const item = itemEnd(text, open);
      if (item === null) return readSharedStringsByTokens(filePath, entry, lastIndex);
      if (item < 0) break;
      strings.push(readItem(text, open, item));
      if (strings.length > lastIndex) return strings;
      at = item;
    }
    rest = text.slice(at);
    // No item start in sight (a prefixed <x:si>, say) or one item larger than any spreadsheet writes: read by tokens.
    if (rest.length > MAX_UNREAD) return readSharedStringsByTokens(filePath, entry, lastIndex);
  }
  if (!PART_END.test(rest)) return readSharedStringsByTokens(filePath, entry, lastIndex);
  return strings;
}

const MAX_UNREAD = 1024 * 1024;

/** Before the first item: the XML declaration and the <sst> start tag; after the last, its end tag. */
const PART_START = /^\s*(?:<\?xml[^?]*\?>)?\s*<sst\b[^<>]*>\s*$/;
const PART_END = /^\s*(?:<\/sst>\s*)?$/;

/** Where the item at `open` ends (just past `</si>` or `<si/>`); -1 when the text ends first, null when it is not an item. */
function itemEnd(text: string, open: number): number | null {
  const next = text.charCodeAt(open + 3);
  if (Number.isNaN(next)) return -1;
  if (next === 47 /* / */) return text.startsWith("<si/>", open) ? open + 5 : text.length < open + 5 ? -1 : null;
  if (next !== 62 /* > */ && next !== 32 /* space */) return null;
  const close = text.indexOf("</si>", open);
  return close < 0 ? -1 : close + 5;
}

const PLAIN_START = "<si><t>";
const PRESERVED_START = '<si><t xml:space="preserve">';
const PLAIN_END = "</t></si>";

function readItem(text: string, start: number, end: number): SharedString {
  const from = text.startsWith(PLAIN_START, start)
    ? start + PLAIN_START.length
    : text.startsWith(PRESERVED_START, start)
      ? start + PRESERVED_START.length
      : -1;
  if (from >= 0) {
    const to = text.indexOf("<", from);
    if (to === end - PLAIN_END.length && text.startsWith(PLAIN_END, to))
      return to === from ? null : decodeXmlEntities(text.slice(from, to));
  }
  const items = new SharedStringItems();
  items.push(new XmlTokenizer().push(text.slice(start, end)), Number.MAX_SAFE_INTEGER);
  if (items.strings.length !== 1) throw new UnsupportedXlsxError("shared string item");
  return items.strings[0];
}

async function readSharedStringsByTokens(
  filePath: string,
  entry: ZipEntry,
  lastIndex: number,
): Promise<SharedString[]> {
  const items = new SharedStringItems();
  const tokenizer = new XmlTokenizer();
  for await (const text of streamZipEntryText(filePath, entry)) {
    if (items.push(tokenizer.push(text), lastIndex)) return items.strings;
  }
  if (tokenizer.pending.trim() !== "") throw new UnsupportedXlsxError(`${entry.name}: cut short`);
  return items.strings;
}

/** The shared-string items in a stream of tokens (ECMA-376 Part 1, §18.4.8), as exceljs reads them. */
class SharedStringItems {
  readonly strings: SharedString[] = [];
  private inItem = false;
  private inText = false;
  private text: string | null = null;
  private inRun = false;
  private plainCount = 0;
  private runs: { text: string }[] = [];

  /** True once item `lastIndex` has been read. */
  push(tokens: XmlToken[], lastIndex: number): boolean {
    for (const token of tokens) {
      if (token.kind === "text") {
        if (this.inText) this.text = (this.text ?? "") + token.text;
        else if (this.inItem && token.text !== "") throw new UnsupportedXlsxError("text outside <t>");
      } else if (token.kind === "open") {
        if (token.name === "si") {
          [this.inItem, this.inRun, this.plainCount, this.runs] = [true, false, 0, []];
        } else if (!this.inItem) continue;
        else if (token.name === "t") {
          [this.text, this.inText] = [null, !token.selfClosing];
          if (!this.inRun) this.plainCount += 1;
        } else if (token.name === "r") this.inRun = !token.selfClosing;
        else if (!RUN_PROPERTIES.has(token.name)) throw new UnsupportedXlsxError(`<${token.name}> in a shared string`);
        if (token.selfClosing) this.closeElement(token.name);
      } else this.closeElement(token.name);
      if (this.strings.length > lastIndex) return true;
    }
    return false;
  }

  private closeElement(name: string) {
    if (!this.inItem) return;
    if (name === "t") {
      this.inText = false;
      return;
    }
    if (name === "r") {
      this.runs.push({ text: this.text ?? "" });
      [this.text, this.inRun] = [null, false];
      return;
    }
    if (name !== "si") return;
    if (this.plainCount > 1 || (this.plainCount > 0 && this.runs.length > 0))
      throw new UnsupportedXlsxError("mixed shared string");
    this.strings.push(this.runs.length > 0 ? { richText: this.runs } : this.text);
    this.inItem = false;
    this.text = null;
  }
}
