import "server-only";

/** One piece of an XML part: a start tag (attributes decoded), an end tag, or decoded text. */
export type XmlToken =
  | { kind: "open"; name: string; attrs: Record<string, string>; selfClosing: boolean }
  | { kind: "close"; name: string }
  | { kind: "text"; text: string };

/** Thrown when a part holds XML the fast readers do not handle; callers fall back to exceljs. */
export class UnsupportedXlsxError extends Error {}

const ENTITY = /&(#x[0-9a-f]+|#\d+|amp|lt|gt|quot|apos);/gi;
const NAMED: Record<string, string> = { amp: "&", lt: "<", gt: ">", quot: '"', apos: "'" };
const ATTRIBUTE = /([\w:.-]+)\s*=\s*(?:"([^"]*)"|'([^']*)')/g;

/** XML 1.0 §4.6 predefined entities and §4.1 character references; anything else is refused. */
export function decodeXmlEntities(text: string): string {
  if (!text.includes("&")) return text;
  let known = 0;
  const decoded = text.replace(ENTITY, (_, entity: string) => {
    known += 1;
    const lower = entity.toLowerCase();
    if (lower.startsWith("#x")) return String.fromCodePoint(parseInt(lower.slice(2), 16));
    if (lower.startsWith("#")) return String.fromCodePoint(parseInt(lower.slice(1), 10));
    return NAMED[lower];
  });
  // An undeclared entity or a bare ampersand is not well-formed: let the full reader judge it.
  if (known !== text.split("&").length - 1) throw new UnsupportedXlsxError("unknown XML entity");
  return decoded;
}

function localName(qualified: string): string {
  const colon = qualified.indexOf(":");
  return colon < 0 ? qualified : qualified.slice(colon + 1);
}

/**
 * A small streaming tokenizer for the SpreadsheetML parts the preview reads: feed it text chunks
 * in order; it returns the tokens complete so far and keeps an unfinished tag for the next chunk.
 * Element names lose their namespace prefix; comments, processing instructions and the XML
 * declaration are skipped; a DOCTYPE (never written by spreadsheet programs) is refused.
 */
export class XmlTokenizer {
  private rest = "";

  push(chunk: string): XmlToken[] {
    const text = this.rest + chunk;
    const tokens: XmlToken[] = [];
    let at = 0;
    while (at < text.length) {
      const lt = text.indexOf("<", at);
      if (lt < 0) break; // text runs on into the next chunk
      if (lt > at) tokens.push({ kind: "text", text: decodeXmlEntities(text.slice(at, lt)) });
      const end = this.tagEnd(text, lt);
      if (end < 0) {
        at = lt;
        this.rest = text.slice(at);
        return tokens;
      }
      this.readTag(text.slice(lt, end + 1), tokens);
      at = end + 1;
    }
    this.rest = text.slice(at);
    return tokens;
  }

  private tagEnd(text: string, lt: number): number {
    if (text.startsWith("<!--", lt)) {
      const close = text.indexOf("-->", lt + 4);
      return close < 0 ? -1 : close + 2;
    }
    if (text.startsWith("<![CDATA[", lt) || text.startsWith("<!DOCTYPE", lt))
      throw new UnsupportedXlsxError("CDATA or DOCTYPE");
    if (text.length - lt < 9 && ("<![CDATA[".startsWith(text.slice(lt)) || "<!DOCTYPE".startsWith(text.slice(lt))))
      return -1;
    let quote = "";
    for (let i = lt + 1; i < text.length; i += 1) {
      const ch = text[i];
      if (quote) {
        if (ch === quote) quote = "";
      } else if (ch === '"' || ch === "'") quote = ch;
      else if (ch === ">") return i;
    }
    return -1;
  }

  private readTag(tag: string, tokens: XmlToken[]): void {
    if (tag.startsWith("<?") || tag.startsWith("<!--")) return;
    if (tag.startsWith("</")) {
      tokens.push({ kind: "close", name: localName(tag.slice(2, -1).trim()) });
      return;
    }
    const selfClosing = tag.endsWith("/>");
    const body = tag.slice(1, selfClosing ? -2 : -1);
    const nameEnd = body.search(/[\s/]|$/);
    const attrs: Record<string, string> = {};
    for (const match of body.slice(nameEnd).matchAll(ATTRIBUTE))
      attrs[match[1]] = decodeXmlEntities(match[2] ?? match[3] ?? "");
    tokens.push({ kind: "open", name: localName(body.slice(0, nameEnd)), attrs, selfClosing });
  }

  /** Text left when the input ended (an unfinished tag means the part was cut short). */
  get pending(): string {
    return this.rest;
  }
}
