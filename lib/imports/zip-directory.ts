import "server-only";
import { open, type FileHandle } from "node:fs/promises";
import { inflateRawSync } from "node:zlib";
import { ImportError } from "./import-error";

// Layout of a zip archive per PKWARE APPNOTE.TXT 6.3: end of central directory record (4.3.16),
// central directory file headers (4.3.12), local file headers (4.3.7).
const EOCD_SIGNATURE = 0x06054b50;
const CENTRAL_SIGNATURE = 0x02014b50;
const LOCAL_SIGNATURE = 0x04034b50;
const EOCD_MIN = 22;
const EOCD_SEARCH = EOCD_MIN + 0xffff; // the record ends with a comment of up to 65535 bytes

export interface ZipEntry {
  name: string;
  method: number;
  compressedSize: number;
  size: number;
  localHeaderOffset: number;
}

async function readAt(handle: FileHandle, position: number, length: number): Promise<Buffer> {
  const buffer = Buffer.alloc(length);
  const { bytesRead } = await handle.read(buffer, 0, length, position);
  return buffer.subarray(0, bytesRead);
}

/** Lists the entries of a zip archive from its central directory; null when it is not a readable zip. */
export async function listZipEntries(filePath: string): Promise<ZipEntry[] | null> {
  const handle = await open(filePath, "r");
  try {
    const { size } = await handle.stat();
    const tailStart = Math.max(0, size - EOCD_SEARCH);
    const tail = await readAt(handle, tailStart, size - tailStart);
    let eocd = -1;
    for (let i = tail.length - EOCD_MIN; i >= 0; i -= 1) {
      if (tail.readUInt32LE(i) === EOCD_SIGNATURE) {
        eocd = i;
        break;
      }
    }
    if (eocd < 0) return null;
    const count = tail.readUInt16LE(eocd + 10);
    const directorySize = tail.readUInt32LE(eocd + 12);
    const directoryOffset = tail.readUInt32LE(eocd + 16);
    if (directoryOffset + directorySize > size) return null;
    const directory = await readAt(handle, directoryOffset, directorySize);
    const entries: ZipEntry[] = [];
    let at = 0;
    for (let i = 0; i < count && at + 46 <= directory.length; i += 1) {
      if (directory.readUInt32LE(at) !== CENTRAL_SIGNATURE) return null;
      const nameLength = directory.readUInt16LE(at + 28);
      entries.push({
        method: directory.readUInt16LE(at + 10),
        compressedSize: directory.readUInt32LE(at + 20),
        size: directory.readUInt32LE(at + 24),
        localHeaderOffset: directory.readUInt32LE(at + 42),
        name: directory.toString("utf8", at + 46, at + 46 + nameLength),
      });
      at += 46 + nameLength + directory.readUInt16LE(at + 30) + directory.readUInt16LE(at + 32);
    }
    return entries;
  } finally {
    await handle.close();
  }
}

/** Reads one (small) stored or deflated entry in full. */
export async function readZipEntry(filePath: string, entry: ZipEntry, maxBytes = 32 * 1024 * 1024): Promise<Buffer> {
  if (entry.size > maxBytes) throw new RangeError(`zip entry ${entry.name} is larger than ${maxBytes} bytes`);
  const handle = await open(filePath, "r");
  try {
    const header = await readAt(handle, entry.localHeaderOffset, 30);
    if (header.length < 30 || header.readUInt32LE(0) !== LOCAL_SIGNATURE) {
      throw new RangeError(`zip entry ${entry.name} has no local header`);
    }
    const dataStart = entry.localHeaderOffset + 30 + header.readUInt16LE(26) + header.readUInt16LE(28);
    const data = await readAt(handle, dataStart, entry.compressedSize);
    if (entry.method === 0) return data;
    if (entry.method === 8) {
      try {
        return inflateRawSync(data, { maxOutputLength: maxBytes });
      } catch (err) {
        // The declared size lied: the part inflates past what we read in full.
        if ((err as { code?: string }).code === "ERR_BUFFER_TOO_LARGE") throw new ImportError("file-too-large", `The workbook part ${entry.name} expands to more than ${maxBytes / 1024 / 1024} MB; it is refused as a likely zip bomb.`);
        throw err;
      }
    }
    throw new RangeError(`zip entry ${entry.name} uses unsupported compression method ${entry.method}`);
  } finally {
    await handle.close();
  }
}
