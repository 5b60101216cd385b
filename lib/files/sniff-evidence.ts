import "server-only";
import { cfbEntryNames } from "./cfb-names";
import { knownRefusedFormat, magicFormat } from "./magic";
import { zipEntryNames } from "./zip";

export type EvidenceKind =
  "pdf" | "png" | "jpeg" | "gif" | "webp" | "tiff" | "xlsx" | "docx" | "xls" | "doc" | "msg" | "eml" | "csv" | "text";
export type EvidenceSniff =
  { ok: true; kind: EvidenceKind; contentType: string; label: string } | { ok: false; reason: string };

export const ACCEPTED_EVIDENCE =
  "PDF, PNG, JPEG, GIF, WebP or TIFF images, Excel or Word files (.xlsx, .docx, .xls, .doc), Outlook (.msg) or e-mail (.eml) messages, CSV or plain text";

const TYPES: Record<EvidenceKind, [string, string]> = {
  pdf: ["application/pdf", "PDF document"],
  png: ["image/png", "PNG image"],
  jpeg: ["image/jpeg", "JPEG image"],
  gif: ["image/gif", "GIF image"],
  webp: ["image/webp", "WebP image"],
  tiff: ["image/tiff", "TIFF image"],
  xlsx: ["application/vnd.openxmlformats-officedocument.spreadsheetml.sheet", "Excel workbook"],
  docx: ["application/vnd.openxmlformats-officedocument.wordprocessingml.document", "Word document"],
  xls: ["application/vnd.ms-excel", "Excel 97-2003 workbook"],
  doc: ["application/msword", "Word 97-2003 document"],
  msg: ["application/vnd.ms-outlook", "Outlook message"],
  eml: ["message/rfc822", "E-mail message"],
  csv: ["text/csv; charset=utf-8", "CSV text"],
  text: ["text/plain; charset=utf-8", "Plain text"],
};

const accept = (kind: EvidenceKind): EvidenceSniff => ({
  ok: true,
  kind,
  contentType: TYPES[kind][0],
  label: TYPES[kind][1],
});
const refuse = (why: string): EvidenceSniff => ({
  ok: false,
  reason: `${why} Accepted evidence: ${ACCEPTED_EVIDENCE}.`,
});

/**
 * What an evidence file is, from its bytes alone (the name only tells CSV from plain text, both
 * text): the accepted kinds with their content type, or the reason it is refused.
 */
export async function sniffEvidence(bytes: Uint8Array, fileName = ""): Promise<EvidenceSniff> {
  if (bytes.length === 0) return refuse("The file is empty.");
  const format = magicFormat(bytes);
  if (format === "zip") return sniffOfficeOpenXml(bytes);
  if (format === "cfb") return sniffCompoundFile(bytes);
  if (format) return accept(format);
  const refused = knownRefusedFormat(bytes);
  if (refused) return refuse(`The file is ${refused}, whatever its name.`);
  // Header fields are US-ASCII (RFC 5322 §2.2); a message body may hold 8-bit text in any charset.
  if (looksLikeEmail(new TextDecoder("latin1").decode(bytes.subarray(0, 65536)))) return accept("eml");
  const text = decodeText(bytes);
  if (text === null)
    return refuse(`The file's content is not an accepted type (it begins with the bytes ${hexHead(bytes)}).`);
  if (typeof text === "object") return refuse(text.reason);
  return accept(/\.csv$/i.test(fileName) ? "csv" : "text");
}

/** ECMA-376 Part 2 (Open Packaging Conventions): a zip with [Content_Types].xml and the main part of its kind. */
async function sniffOfficeOpenXml(bytes: Uint8Array): Promise<EvidenceSniff> {
  const names = await zipEntryNames(bytes);
  if (!names)
    return refuse("The file starts like a zip archive but its directory cannot be read (truncated or damaged?).");
  const has = (n: string) => names.includes(n);
  if (!has("[Content_Types].xml"))
    return refuse("The file is a zip archive, not an Office document; upload the files inside it one by one.");
  if (names.some((n) => /(^|\/)vbaProject\.bin$/i.test(n)))
    return refuse(
      "The Office file contains macros, which are not accepted as evidence: save it without macros (.xlsx or .docx).",
    );
  if (has("xl/workbook.xml")) return accept("xlsx");
  if (has("word/document.xml")) return accept("docx");
  return refuse("The file is an Office package that is neither an Excel workbook nor a Word document.");
}

/** [MS-CFB] compound file: tells the legacy Excel, Word and Outlook formats by their streams ([MS-XLS] 2.1.2, [MS-DOC] 2.1, [MS-OXMSG] 2.1). */
function sniffCompoundFile(bytes: Uint8Array): EvidenceSniff {
  const names = cfbEntryNames(bytes);
  if (!names)
    return refuse(
      "The file starts like an Office 97-2003 file but its structure cannot be read (truncated or damaged?).",
    );
  const has = (n: string) => names.includes(n);
  if (has("EncryptedPackage"))
    return refuse("The file is a password-protected Office document: remove the password and upload it again.");
  if (has("_VBA_PROJECT_CUR") || has("Macros"))
    return refuse("The Office file contains macros, which are not accepted as evidence: save it without macros.");
  if (has("Workbook") || has("Book")) return accept("xls");
  if (has("WordDocument")) return accept("doc");
  if (has("__properties_version1.0") && names.some((n) => n.startsWith("__substg1.0_"))) return accept("msg");
  return refuse(
    "The file is an Office 97-2003 compound file that is neither an Excel workbook, a Word document nor an Outlook message.",
  );
}

/** The text of a valid UTF-8 file; an object with the reason when it is not text; null when it is not UTF-8. */
function decodeText(bytes: Uint8Array): string | { reason: string } | null {
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    return null;
  }
  const nul = text.indexOf("\u0000");
  if (nul >= 0) return { reason: `The file is not text: it holds a NUL byte at position ${nul + 1}.` };
  let controls = 0;
  for (let i = 0; i < Math.min(text.length, 65536); i++) {
    const c = text.charCodeAt(i);
    if (c < 0x20 && c !== 0x09 && c !== 0x0a && c !== 0x0c && c !== 0x0d) controls++;
  }
  if (controls > Math.max(8, Math.min(text.length, 65536) / 100))
    return { reason: `The file is not text: ${controls} control characters in its first part.` };
  return text;
}

const FIELD = /^[\x21-\x39\x3b-\x7e]+:/; // RFC 5322 §2.2 / §3.6.8: field-name = 1*ftext (printable US-ASCII except ":")

/** RFC 5322 §2.1–§3.6: a header section of fields (or folded lines) up to the first empty line, with From and Date (§3.6, the only required fields). */
export function looksLikeEmail(text: string): boolean {
  const end = text.search(/\r?\n\r?\n/);
  const header = end < 0 ? text.slice(0, 65536) : text.slice(0, end);
  if (header.length === 0 || (end < 0 && text.length >= 65536)) return false;
  const names = new Set<string>();
  for (const line of header.split(/\r?\n/)) {
    if (/^[ \t]/.test(line) && names.size > 0) continue;
    if (!FIELD.test(line)) return false;
    names.add(line.slice(0, line.indexOf(":")).toLowerCase());
  }
  return names.has("from") && names.has("date");
}

function hexHead(bytes: Uint8Array): string {
  return [...bytes.subarray(0, 8)].map((b) => b.toString(16).toUpperCase().padStart(2, "0")).join(" ");
}
