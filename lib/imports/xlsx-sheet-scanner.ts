import "server-only";
import { addCell, columnNumber, styleFormat, type OpenCell, type PendingRow } from "./xlsx-cell-values";
import type { WorkbookParts } from "./xlsx-parts";
import { UnsupportedXlsxError, decodeXmlEntities } from "./xml-tokens";

const LT = 60; // <
const GT = 62; // >
const SLASH = 47;
const EQUALS = 61;
const QUOTE = 34;
const APOSTROPHE = 39;

function isSpace(code: number): boolean {
  return code === 32 || code === 10 || code === 13 || code === 9;
}

/** A start tag's end and the three attributes a sheet's rows and cells use. */
interface StartTag {
  name: string;
  /** Index just past the tag's `>`. */
  end: number;
  selfClosing: boolean;
  r?: string;
  s?: string;
  t?: string;
}

/**
 * The worksheet part of a sheet as written by spreadsheet programs — `<row>`s of `<c>`s holding
 * `<v>`, `<f>` and inline `<is><t>` — read straight from the text into the same rows as the
 * general tokenizer's parser (xlsx-fast-rows.ts), without a token per tag: the full load's reader
 * of a million-row sheet. Anything else (namespace prefixes, comments, rich runs, text between a
 * cell's elements…) throws UnsupportedXlsxError, and the caller reads the sheet the general way.
 */
export class SheetScanner {
  /** Highest shared-string index seen so far. */
  lastShared = -1;
  /** True once </sheetData> has been seen. */
  finished = false;
  private inData = false;
  private text = "";
  private row: PendingRow | null = null;
  /** The start tag last read (one object, reused). */
  private readonly tag: StartTag = { name: "", end: 0, selfClosing: false };

  /** True from a row's deciding cell to its end tag (see `rowDecided`). */
  private skipping = false;

  /**
   * `rowDecided`, when given, is asked after each cell whether the row so far says all the caller
   * needs (a counter needs only a row's first value): the rest of that row is then skipped unread.
   */
  constructor(
    private readonly parts: WorkbookParts,
    private readonly rowDecided?: (row: PendingRow) => boolean,
  ) {}

  /** Reads the next chunk of the part; rows completed are added to `out`. */
  pushText(chunk: string, out: PendingRow[]): void {
    if (this.finished) return;
    const text = this.text + chunk;
    // Each reader returns where the unread rest begins: an unfinished tag or cell waits for the next chunk.
    const at = this.inData ? this.readData(text, 0, out) : this.findSheetData(text, out);
    this.text = text.slice(at);
  }

  private findSheetData(text: string, out: PendingRow[]): number {
    const found = text.indexOf("sheetData");
    if (found < 0) return Math.max(0, text.length - 16);
    if (found === 0 || text.charCodeAt(found - 1) !== LT) throw new UnsupportedXlsxError("sheetData with a prefix");
    const tag = this.readStartTag(text, found - 1);
    if (tag === null) return found - 1;
    if (tag.name !== "sheetData") throw new UnsupportedXlsxError(`<${tag.name}>`);
    if (tag.selfClosing) {
      this.finished = true;
      return tag.end;
    }
    this.inData = true;
    return this.readData(text, tag.end, out);
  }

  /** Rows and cells from `at`; returns where the unread rest begins. */
  private readData(text: string, at: number, out: PendingRow[]): number {
    for (;;) {
      if (this.skipping) {
        const rowEnd = text.indexOf("</row>", at);
        if (rowEnd < 0) return Math.max(at, text.length - "</row>".length);
        [this.skipping, at] = [false, rowEnd];
      }
      const lt = text.indexOf("<", at);
      if (lt < 0) return text.length; // text between rows is ignored, as the general parser ignores it
      if (lt + 1 >= text.length) return lt;
      if (text.charCodeAt(lt + 1) === SLASH) {
        const gt = text.indexOf(">", lt);
        if (gt < 0) return lt;
        if (text.startsWith("</row>", lt) && this.row) {
          out.push(this.row);
          this.row = null;
        } else if (text.startsWith("</sheetData>", lt)) {
          this.finished = true;
          return gt + 1;
        } else throw new UnsupportedXlsxError(text.slice(lt, gt + 1));
        at = gt + 1;
        continue;
      }
      const tag = this.readStartTag(text, lt);
      if (tag === null) return lt;
      if (tag.name === "row") {
        const rowNumber = parseInt(tag.r ?? "", 10);
        if (!Number.isFinite(rowNumber)) throw new UnsupportedXlsxError("row without r");
        const rowStyle = tag.s ? styleFormat(this.parts, parseInt(tag.s, 10)) : null;
        const row: PendingRow = { rowNumber, rowFormat: rowStyle?.format, cells: [] };
        if (tag.selfClosing) out.push(row);
        else this.row = row;
        at = tag.end;
      } else if (tag.name === "c" && this.row) {
        const cell: OpenCell = {
          column: columnNumber(tag.r),
          style: parseInt(tag.s ?? "", 10) || 0,
          type: tag.t,
          texts: 0,
        };
        let end = tag.end;
        if (!tag.selfClosing) {
          const close = text.indexOf("</c>", tag.end);
          if (close < 0) return lt;
          this.readCellContent(text, tag.end, close, cell);
          end = close + 4;
        }
        const shared = addCell(this.parts, this.row, cell);
        if (shared > this.lastShared) this.lastShared = shared;
        if (this.rowDecided?.(this.row)) this.skipping = true;
        at = end;
      } else throw new UnsupportedXlsxError(`<${tag.name}> in sheetData`);
    }
  }

  /** The `<f>`, `<v>` and `<is><t>` between a cell's start tag and its `</c>` (all in `text`). */
  private readCellContent(text: string, from: number, close: number, cell: OpenCell): void {
    let at = from;
    while (at < close) {
      if (text.charCodeAt(at) !== LT) throw new UnsupportedXlsxError("text outside <v>");
      if (text.startsWith("</is>", at)) {
        at += 5;
        continue;
      }
      const tag = this.readStartTag(text, at);
      if (tag === null || tag.end > close) throw new UnsupportedXlsxError("cell cut short");
      at = tag.end;
      if (tag.name === "is") {
        cell.value = "";
        continue;
      }
      if (tag.name !== "v" && tag.name !== "f" && tag.name !== "t")
        throw new UnsupportedXlsxError(`<${tag.name}> in a cell`);
      if (tag.name === "t") {
        cell.texts += 1;
        if (cell.texts > 1) throw new UnsupportedXlsxError("rich inline string");
      }
      let content = "";
      if (!tag.selfClosing) {
        const end = text.indexOf("<", at);
        const name = tag.name;
        if (
          end < 0 ||
          end > close ||
          text.charCodeAt(end + 1) !== SLASH ||
          !text.startsWith(name, end + 2) ||
          text.charCodeAt(end + 2 + name.length) !== GT
        )
          throw new UnsupportedXlsxError(`<${tag.name}> holding more than text`);
        content = decodeXmlEntities(text.slice(at, end));
        at = end + tag.name.length + 3;
      }
      if (tag.name === "f") cell.formula = content;
      else cell.value = content;
    }
  }

  /** The start tag at `lt` (which holds `<`), or null when the text ends inside it. */
  private readStartTag(text: string, lt: number): StartTag | null {
    let i = lt + 1;
    const length = text.length;
    while (i < length) {
      const code = text.charCodeAt(i);
      if (isSpace(code) || code === SLASH || code === GT) break;
      i += 1;
    }
    if (i >= length) return null;
    const tag = this.tag;
    tag.name = elementName(text, lt + 1, i);
    tag.r = tag.s = tag.t = undefined;
    tag.selfClosing = false;
    for (;;) {
      while (i < length && isSpace(text.charCodeAt(i))) i += 1;
      if (i >= length) return null;
      const code = text.charCodeAt(i);
      if (code === GT) {
        tag.end = i + 1;
        return tag;
      }
      if (code === SLASH) {
        if (i + 1 >= length) return null;
        if (text.charCodeAt(i + 1) !== GT) throw new UnsupportedXlsxError(`<${tag.name}>: stray /`);
        tag.selfClosing = true;
        tag.end = i + 2;
        return tag;
      }
      const nameStart = i;
      while (i < length) {
        const c = text.charCodeAt(i);
        if (c === EQUALS || isSpace(c) || c === GT || c === SLASH) break;
        i += 1;
      }
      // r, s and t are the only attributes read; a one-letter name is one of them or ignored.
      const attribute = i - nameStart === 1 ? text.charCodeAt(nameStart) : 0;
      while (i < length && isSpace(text.charCodeAt(i))) i += 1;
      if (i >= length) return null;
      if (text.charCodeAt(i) !== EQUALS) throw new UnsupportedXlsxError(`<${tag.name}>: attribute without a value`);
      i += 1;
      while (i < length && isSpace(text.charCodeAt(i))) i += 1;
      if (i >= length) return null;
      const quote = text.charCodeAt(i);
      if (quote !== QUOTE && quote !== APOSTROPHE) throw new UnsupportedXlsxError(`<${tag.name}>: unquoted attribute`);
      const valueEnd = text.indexOf(quote === QUOTE ? '"' : "'", i + 1);
      if (valueEnd < 0) return null;
      if (attribute === R || attribute === S || attribute === T) {
        const value = decodeXmlEntities(text.slice(i + 1, valueEnd));
        if (attribute === R) tag.r = value;
        else if (attribute === S) tag.s = value;
        else tag.t = value;
      }
      i = valueEnd + 1;
    }
  }
}

const R = 114;
const S = 115;
const T = 116;
const KNOWN_NAMES = ["c", "v", "row", "f", "t", "is", "sheetData"];

/** The element name between `from` and `to`, as one of the known names' own strings (no copy) when it is one. */
function elementName(text: string, from: number, to: number): string {
  for (const known of KNOWN_NAMES) {
    if (known.length === to - from && text.startsWith(known, from)) return known;
  }
  const name = text.slice(from, to);
  throw new UnsupportedXlsxError(`<${name}>`);
}
