import "server-only";

// PKWARE APPNOTE.TXT 6.3: local file header signature "PK\x03\x04" (4.3.7), end of central
// directory record (4.3.16, 22 bytes plus a comment of up to 65,535), central directory headers (4.3.12).
export const ZIP_MAGIC = [0x50, 0x4b, 0x03, 0x04];
const EOCD_SIGNATURE = 0x06054b50;
const CENTRAL_SIGNATURE = 0x02014b50;
const EOCD_MIN = 22;

export function startsWithBytes(bytes: Uint8Array, magic: number[], offset = 0): boolean {
  return bytes.length >= offset + magic.length && magic.every((b, i) => bytes[offset + i] === b);
}

/** The entry names of a zip archive held in memory, from its central directory; null when it is not a readable zip. */
export function zipEntryNames(bytes: Uint8Array): string[] | null {
  if (!startsWithBytes(bytes, ZIP_MAGIC) || bytes.length < EOCD_MIN) return null;
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let eocd = -1;
  for (let i = bytes.length - EOCD_MIN; i >= Math.max(0, bytes.length - EOCD_MIN - 0xffff); i -= 1) {
    if (view.getUint32(i, true) === EOCD_SIGNATURE) {
      eocd = i;
      break;
    }
  }
  if (eocd < 0) return null;
  const count = view.getUint16(eocd + 10, true);
  const size = view.getUint32(eocd + 12, true);
  const offset = view.getUint32(eocd + 16, true);
  if (offset + size > bytes.length) return null;
  const names: string[] = [];
  const decoder = new TextDecoder("utf-8");
  let at = offset;
  for (let i = 0; i < count; i += 1) {
    if (at + 46 > offset + size || view.getUint32(at, true) !== CENTRAL_SIGNATURE) return null;
    const nameLength = view.getUint16(at + 28, true);
    names.push(decoder.decode(bytes.subarray(at + 46, at + 46 + nameLength)));
    at += 46 + nameLength + view.getUint16(at + 30, true) + view.getUint16(at + 32, true);
  }
  return names;
}
