/**
 * The magic numbers Sondage tells files apart by, each from its format's own specification: one
 * table for every upload (ledger imports, evidence, client files). A file's kind is read from its
 * first bytes, never from its name.
 */
export type MagicFormat = "pdf" | "png" | "jpeg" | "gif" | "tiff" | "webp" | "zip" | "cfb";

const ascii = (s: string) => [...s].map((c) => c.charCodeAt(0));

export const ZIP_MAGIC = [0x50, 0x4b, 0x03, 0x04]; // "PK\x03\x04", PKWARE APPNOTE.TXT 6.3, 4.3.7 local file header
export const CFB_MAGIC = [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]; // [MS-CFB] 2.2: legacy .xls, .doc, .msg

const MAGIC: [MagicFormat, number[][]][] = [
  ["pdf", [ascii("%PDF-")]], //                                ISO 32000-1:2008 §7.5.2 "File Header"
  ["png", [[0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]]], // PNG (W3C / ISO/IEC 15948) §5.2 "PNG signature"
  ["jpeg", [[0xff, 0xd8, 0xff]]], //                           ISO/IEC 10918-1 Annex B: SOI marker FFD8, then a marker
  ["gif", [ascii("GIF87a"), ascii("GIF89a")]], //              GIF89a specification §17 "Header"
  [
    "tiff",
    [
      [0x49, 0x49, 0x2a, 0x00],
      [0x4d, 0x4d, 0x00, 0x2a],
    ],
  ], // TIFF 6.0 §2 "Image File Header" (II*\0, MM\0*)
  ["zip", [ZIP_MAGIC]],
  ["cfb", [CFB_MAGIC]],
];

// Recognised only to name them in a refusal.
const KNOWN_REFUSED: [number[], string][] = [
  [ascii("MZ"), "a Windows program"],
  [[0x7f, 0x45, 0x4c, 0x46], "a Linux program"],
  [[0x1f, 0x8b], "a gzip archive"],
  [ascii("Rar!"), "a RAR archive"],
  [[0x37, 0x7a, 0xbc, 0xaf, 0x27, 0x1c], "a 7-Zip archive"],
];

export function startsWithBytes(bytes: Uint8Array, magic: number[], offset = 0): boolean {
  return bytes.length >= offset + magic.length && magic.every((b, i) => bytes[offset + i] === b);
}

/** The format a file's first bytes announce, or null (text, or something we do not know). */
export function magicFormat(bytes: Uint8Array): MagicFormat | null {
  for (const [format, magics] of MAGIC) if (magics.some((m) => startsWithBytes(bytes, m))) return format;
  if (startsWithBytes(bytes, ascii("RIFF")) && startsWithBytes(bytes, ascii("WEBP"), 8)) return "webp"; // RFC 9649 §2.5 RIFF header
  return null;
}

/** What a refused kind of file is ("a Windows program"), to say so; null when it is none of them. */
export function knownRefusedFormat(bytes: Uint8Array): string | null {
  for (const [magic, what] of KNOWN_REFUSED) if (startsWithBytes(bytes, magic)) return what;
  return null;
}
