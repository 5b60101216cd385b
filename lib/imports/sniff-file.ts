import "server-only";
import { open } from "node:fs/promises";
import { magicFormat, startsWithBytes } from "@/lib/files/magic";
import { ImportError } from "./import-error";
import { SNIFF_BYTES, type ImportLimits } from "./limits";
import { hasWorkbookPart } from "./xlsx-sheets";

export type TextEncoding = "utf-8" | "utf-8-bom" | "windows-1252";
export type FileSniff = { kind: "xlsx"; size: number } | { kind: "csv"; encoding: TextEncoding; size: number };

// Bytes with no character in code page 1252 (unicode.org MAPPINGS/VENDORS/MICSFT/WINDOWS/CP1252.TXT:
// 0x81, 0x8D, 0x8F, 0x90, 0x9D are UNDEFINED); a file holding them is neither UTF-8 nor Windows-1252.
const UNDEFINED_IN_1252 = new Set([0x81, 0x8d, 0x8f, 0x90, 0x9d]);

export function formatMegabytes(bytes: number): string {
  const mb = bytes / (1024 * 1024);
  return `${mb >= 10 ? Math.round(mb) : mb.toFixed(1)} MB`;
}

/**
 * Tells an upload's kind and text encoding from its content (never its extension), refusing
 * empty, oversized, binary, legacy-Excel and non-UTF-8/Windows-1252 files with the reason named.
 */
export async function sniffFile(filePath: string, limits: Pick<ImportLimits, "maxBytes">): Promise<FileSniff> {
  const handle = await open(filePath, "r");
  let head: Buffer;
  let size: number;
  try {
    size = (await handle.stat()).size;
    if (size === 0) throw new ImportError("empty-file", "The file is empty.");
    if (size > limits.maxBytes) {
      throw new ImportError(
        "file-too-large",
        `The file is ${formatMegabytes(size)}; the largest upload accepted is ${formatMegabytes(limits.maxBytes)}.`,
      );
    }
    head = Buffer.alloc(Math.min(size, SNIFF_BYTES));
    await handle.read(head, 0, head.length, 0);
  } finally {
    await handle.close();
  }
  const format = magicFormat(head);
  if (format === "zip") {
    if (await hasWorkbookPart(filePath)) return { kind: "xlsx", size };
    throw new ImportError(
      "not-a-workbook",
      "The file is a zip archive but not an Excel workbook (.xlsx). Upload an .xlsx or a CSV file.",
    );
  }
  if (format === "cfb") {
    // the Excel 97-2003 .xls container
    throw new ImportError(
      "unsupported-format",
      "The file is in the old Excel 97-2003 (.xls) format. Save it as .xlsx or as CSV UTF-8 and upload again.",
    );
  }
  return { kind: "csv", encoding: detectTextEncoding(head, size > head.length), size };
}

/** Encoding of a text file's first bytes; `truncated` when more of the file follows. */
export function detectTextEncoding(head: Uint8Array, truncated: boolean): TextEncoding {
  if (startsWithBytes(head, [0xff, 0xfe]) || startsWithBytes(head, [0xfe, 0xff])) {
    throw new ImportError(
      "unsupported-encoding",
      "The file is encoded as UTF-16 (or UTF-32), which is not supported. Save it as CSV UTF-8 and upload again.",
    );
  }
  if (startsWithBytes(head, [0, 0, 0xfe, 0xff])) {
    throw new ImportError(
      "unsupported-encoding",
      "The file is encoded as UTF-32, which is not supported. Save it as CSV UTF-8 and upload again.",
    );
  }
  rejectBinary(head);
  const hasBom = startsWithBytes(head, [0xef, 0xbb, 0xbf]);
  try {
    new TextDecoder("utf-8", { fatal: true }).decode(head, { stream: truncated });
    return hasBom ? "utf-8-bom" : "utf-8";
  } catch {
    if (hasBom) {
      throw new ImportError(
        "unsupported-encoding",
        "The file starts with a UTF-8 byte-order mark but holds bytes that are not valid UTF-8.",
      );
    }
  }
  const undefinedAt = head.findIndex((byte) => UNDEFINED_IN_1252.has(byte));
  if (undefinedAt >= 0) {
    throw new ImportError(
      "unsupported-encoding",
      `The file's text encoding is neither UTF-8 nor Windows-1252 (byte 0x${head[undefinedAt].toString(16).toUpperCase()} at position ${undefinedAt + 1}). Save it as CSV UTF-8 and upload again.`,
    );
  }
  return "windows-1252";
}

function rejectBinary(head: Uint8Array): void {
  const nulAt = head.indexOf(0);
  if (nulAt >= 0) {
    throw new ImportError(
      "binary-file",
      `The file is not text: it holds a NUL byte at position ${nulAt + 1}. Upload a CSV or .xlsx file.`,
    );
  }
  let controls = 0;
  for (const byte of head) {
    if ((byte < 0x09 || (byte > 0x0d && byte < 0x20)) && byte !== 0x1a) controls += 1;
  }
  if (controls > Math.max(8, head.length / 100)) {
    throw new ImportError(
      "binary-file",
      `The file is not text: ${controls} control bytes in its first ${head.length} bytes. Upload a CSV or .xlsx file.`,
    );
  }
}
