import "server-only";
import iconv from "iconv-lite";
import { ImportError } from "./import-error";
import type { TextEncoding } from "./sniff-file";

export interface ChunkDecoder {
  write(bytes: Buffer): string;
  end(): string;
}

/**
 * A streaming decoder for the detected encoding. UTF-8 is decoded strictly (a bad byte past the
 * sniffed head refuses the file, naming where) and loses its byte-order mark; Windows-1252 goes
 * through iconv-lite.
 */
export function createChunkDecoder(encoding: TextEncoding): ChunkDecoder {
  if (encoding === "windows-1252") {
    const decoder = iconv.getDecoder("windows-1252");
    return { write: (bytes) => decoder.write(bytes), end: () => decoder.end() ?? "" };
  }
  const decoder = new TextDecoder("utf-8", { fatal: true });
  let offset = 0;
  const fail = (): never => {
    throw new ImportError(
      "unsupported-encoding",
      `The file is not valid UTF-8: a bad byte sequence after byte ${offset}. Save it as CSV UTF-8 and upload again.`,
    );
  };
  return {
    write(bytes) {
      try {
        const text = decoder.decode(bytes, { stream: true });
        offset += bytes.length;
        return text;
      } catch {
        return fail();
      }
    },
    end() {
      try {
        return decoder.decode();
      } catch {
        return fail();
      }
    },
  };
}
