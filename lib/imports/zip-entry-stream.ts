import "server-only";
import { StringDecoder } from "node:string_decoder";
import { zipEntryChunks, type ZipEntry } from "@/lib/files/zip";
import { ImportError } from "./import-error";
import { UnsupportedXlsxError } from "./xml-tokens";
import { assertInflationWithinLimits } from "./zip-limits";

const STORED = 0;
const DEFLATED = 8; // PKWARE APPNOTE.TXT 4.4.5: the only methods a workbook uses

/**
 * Streams one zip entry as UTF-8 text, inflating only as much as the caller reads: stop the
 * loop and the archive is released. Methods other than stored and deflate are refused as
 * unsupported; what the entry really inflates to is held to the caps (its declared size can lie).
 */
export async function* streamZipEntryText(filePath: string, entry: ZipEntry): AsyncGenerator<string> {
  if (entry.method !== STORED && entry.method !== DEFLATED)
    throw new UnsupportedXlsxError(`${entry.name}: compression method ${entry.method}`);
  if (entry.compressedSize === 0) return;
  const decoder = new StringDecoder("utf8");
  let first = true;
  let inflated = 0;
  for await (const chunk of zipEntryChunks(filePath, entry)) {
    inflated += chunk.length;
    assertInflationWithinLimits(entry.name, inflated, entry.compressedSize);
    let text = decoder.write(chunk);
    if (first) {
      text = text.replace(/^\uFEFF/, "");
      first = false;
    }
    if (text) yield text;
  }
  const tail = decoder.end();
  if (tail) yield tail;
}

/** Reads one (small) stored or deflated entry in full; one that inflates past `maxBytes` is refused as a likely zip bomb. */
export async function readZipEntry(filePath: string, entry: ZipEntry, maxBytes = 32 * 1024 * 1024): Promise<Buffer> {
  if (entry.size > maxBytes) throw new RangeError(`zip entry ${entry.name} is larger than ${maxBytes} bytes`);
  if (entry.method !== STORED && entry.method !== DEFLATED)
    throw new RangeError(`zip entry ${entry.name} uses unsupported compression method ${entry.method}`);
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of zipEntryChunks(filePath, entry)) {
    size += chunk.length;
    // The declared size lied: the part inflates past what we read in full.
    if (size > maxBytes)
      throw new ImportError(
        "file-too-large",
        `The workbook part ${entry.name} expands to more than ${maxBytes / 1024 / 1024} MB; it is refused as a likely zip bomb.`,
      );
    chunks.push(chunk);
  }
  return Buffer.concat(chunks, size);
}
