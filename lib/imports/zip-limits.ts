import "server-only";
import { zipEntryChunks, type ZipEntry } from "@/lib/files/zip";
import { ImportError } from "./import-error";

/** No part of a workbook we read may inflate past 1 GiB (a 1,000,000-row ledger sheet is about 250 MB of XML). */
export const MAX_INFLATED_PART_BYTES = 1024 * 1024 * 1024;
/**
 * Deflate tops out near 1032:1 (RFC 1951's longest match of 258 bytes per ~2 bits); real ledger
 * sheets compress about 5–20:1. Past 32 MiB inflated, a part running above 400:1 is treated as a
 * zip bomb (common practice: ratio plus absolute caps, as in OWASP's file-upload guidance).
 */
export const MAX_COMPRESSION_RATIO = 400;
const RATIO_CHECK_AFTER = 32 * 1024 * 1024;

function refuse(name: string, why: string): ImportError {
  return new ImportError(
    "file-too-large",
    `The workbook part ${name} ${why}; it is refused as a likely zip bomb. Save the sheet again from your spreadsheet program, or upload it as CSV.`,
  );
}

/** Checks what a part has inflated to so far (or declares it will) against both caps. */
export function assertInflationWithinLimits(name: string, inflatedBytes: number, compressedBytes: number): void {
  if (inflatedBytes > MAX_INFLATED_PART_BYTES)
    throw refuse(name, `expands to more than ${MAX_INFLATED_PART_BYTES / 1024 / 1024} MB`);
  if (inflatedBytes > RATIO_CHECK_AFTER && inflatedBytes / Math.max(1, compressedBytes) > MAX_COMPRESSION_RATIO) {
    throw refuse(name, `expands more than ${MAX_COMPRESSION_RATIO} times its stored size`);
  }
}

/** The central directory's declared sizes, checked before anything is inflated. */
export function assertEntriesWithinLimits(entries: readonly ZipEntry[]): void {
  for (const e of entries) assertInflationWithinLimits(e.name, e.size, e.compressedSize);
}

/**
 * Inflates every deflated part once, counting bytes and keeping none, so a part whose declared
 * size lies is caught at upload, before exceljs's reader (which trusts the stream) sees it at load.
 */
export async function assertZipInflationWithinLimits(filePath: string, entries: readonly ZipEntry[]): Promise<void> {
  for (const entry of entries) {
    if (entry.method !== 8 || entry.compressedSize === 0) continue;
    let inflated = 0;
    try {
      for await (const chunk of zipEntryChunks(filePath, entry)) {
        inflated += chunk.length;
        assertInflationWithinLimits(entry.name, inflated, entry.compressedSize);
      }
    } catch (err) {
      if (err instanceof ImportError) throw err;
      throw new ImportError(
        "unreadable-file",
        `The workbook part ${entry.name} could not be read: ${err instanceof Error ? err.message : String(err)}`,
      );
    }
  }
}
