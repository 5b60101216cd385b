import "server-only";
import { createReadStream } from "node:fs";
import { open } from "node:fs/promises";
import { StringDecoder } from "node:string_decoder";
import { createInflateRaw } from "node:zlib";
import type { ZipEntry } from "./zip-directory";
import { UnsupportedXlsxError } from "./xml-tokens";
import { assertInflationWithinLimits } from "./zip-limits";

const LOCAL_SIGNATURE = 0x04034b50; // PKWARE APPNOTE.TXT 6.3, 4.3.7 local file header
const ZIP64_MARK = 0xffffffff;

export async function dataStart(filePath: string, entry: ZipEntry): Promise<number> {
  const handle = await open(filePath, "r");
  try {
    const header = Buffer.alloc(30);
    const { bytesRead } = await handle.read(header, 0, 30, entry.localHeaderOffset);
    if (bytesRead < 30 || header.readUInt32LE(0) !== LOCAL_SIGNATURE) throw new UnsupportedXlsxError(`${entry.name}: no local header`);
    return entry.localHeaderOffset + 30 + header.readUInt16LE(26) + header.readUInt16LE(28);
  } finally {
    await handle.close();
  }
}

/**
 * Streams one zip entry as UTF-8 text, inflating only as much as the caller reads: stop the
 * loop and the file stream and the inflater are released. Zip64 and methods other than stored
 * (0) and deflate (8) are refused as unsupported.
 */
export async function* streamZipEntryText(filePath: string, entry: ZipEntry): AsyncGenerator<string> {
  if (entry.compressedSize === ZIP64_MARK || entry.size === ZIP64_MARK || entry.localHeaderOffset === ZIP64_MARK) {
    throw new UnsupportedXlsxError(`${entry.name}: zip64`);
  }
  if (entry.method !== 0 && entry.method !== 8) throw new UnsupportedXlsxError(`${entry.name}: compression method ${entry.method}`);
  const start = await dataStart(filePath, entry);
  if (entry.compressedSize === 0) return;
  const file = createReadStream(filePath, { start, end: start + entry.compressedSize - 1, highWaterMark: 64 * 1024 });
  const source = entry.method === 8 ? file.pipe(createInflateRaw({ chunkSize: 64 * 1024 })) : file;
  const decoder = new StringDecoder("utf8");
  let first = true;
  let inflated = 0;
  try {
    for await (const chunk of source as AsyncIterable<Buffer>) {
      // The declared size can lie: count what really comes out of the inflater.
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
  } finally {
    file.destroy();
    if (source !== file) source.destroy();
  }
}
