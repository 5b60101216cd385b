import "server-only";
import { createInflateRaw } from "node:zlib";
import { fromBufferPromise, openPromise, type Entry, type Options, type ZipFile } from "yauzl";

/** One entry of a zip archive as its central directory declares it (sizes can lie: count what inflates). */
export interface ZipEntry {
  name: string;
  /** 0 stored, 8 deflated (PKWARE APPNOTE.TXT 4.4.5). */
  method: number;
  compressedSize: number;
  size: number;
}

// Entry sizes are not validated by yauzl: callers count what an entry really inflates to against
// their own caps (a zip bomb declares small sizes) and refuse it in their own words.
const OPTIONS: Options = { lazyEntries: true, autoClose: false, validateEntrySizes: false };

type Source = string | Uint8Array;

const DEFLATED = 8;
const INFLATE_CHUNK = 256 * 1024;

const openZip = (source: Source): Promise<ZipFile> =>
  typeof source === "string"
    ? openPromise(source, OPTIONS)
    : fromBufferPromise(Buffer.from(source.buffer, source.byteOffset, source.byteLength), OPTIONS);

const entryOf = (e: Entry): ZipEntry => ({
  name: e.fileName,
  method: e.compressionMethod,
  compressedSize: e.compressedSize,
  size: e.uncompressedSize,
});

/** A file system error (the file is missing, say) is not the archive's fault: it is thrown, not read as "not a zip". */
const isFileSystemError = (err: unknown) => typeof (err as { code?: unknown } | null)?.code === "string";

/** The entries of a zip archive (a file path or bytes in memory), from its central directory; null when it is not a readable zip. */
export async function listZipEntries(source: Source): Promise<ZipEntry[] | null> {
  let zip: ZipFile;
  try {
    zip = await openZip(source);
  } catch (err) {
    if (isFileSystemError(err)) throw err;
    return null;
  }
  try {
    const entries: ZipEntry[] = [];
    for await (const e of zip.eachEntry()) entries.push(entryOf(e));
    return entries;
  } catch (err) {
    if (isFileSystemError(err)) throw err;
    return null;
  } finally {
    zip.close();
  }
}

/** The entry names of a zip archive; null when it is not a readable zip. */
export async function zipEntryNames(source: Source): Promise<string[] | null> {
  return (await listZipEntries(source))?.map((e) => e.name) ?? null;
}

/**
 * The inflated bytes of one entry, chunk by chunk, as the caller reads them: stop the loop and the
 * archive is closed. The caller applies its own caps to what it counts.
 */
export async function* zipEntryChunks(source: Source, entry: ZipEntry): AsyncGenerator<Buffer> {
  const zip = await openZip(source);
  try {
    let found: Entry | null = null;
    for await (const e of zip.eachEntry()) {
      if (e.fileName === entry.name) {
        found = e;
        break;
      }
    }
    if (!found) throw new Error(`zip entry ${entry.name} is not in the archive`);
    // Deflated entries are inflated here rather than by yauzl, in chunks larger than zlib's 16 KB
    // default: the inflation (on libuv's thread pool) then runs ahead of the caller's parsing.
    const deflated = found.compressionMethod === DEFLATED;
    const raw = await zip.openReadStreamPromise(found, deflated ? { decompress: false } : {});
    const stream = deflated ? raw.pipe(createInflateRaw({ chunkSize: INFLATE_CHUNK })) : raw;
    try {
      for await (const chunk of stream as AsyncIterable<Buffer>) yield chunk;
    } finally {
      stream.destroy();
      raw.destroy();
    }
  } finally {
    zip.close();
  }
}
