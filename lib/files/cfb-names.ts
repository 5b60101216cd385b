import "server-only";
import { CFB_MAGIC } from "./magic";

// [MS-CFB] Compound File Binary File Format: header signature (2.2), FAT and DIFAT sectors
// (2.3, 2.5), directory entries of 128 bytes (2.6). The container of legacy .xls, .doc and .msg.
const ENDOFCHAIN = 0xfffffffe;
const MAX_REGULAR_SECTOR = 0xfffffffa;
const HEADER_DIFAT_ENTRIES = 109;

/** The names of every storage and stream in a compound file held in memory; null when its structure cannot be read. */
export function cfbEntryNames(bytes: Uint8Array): string[] | null {
  if (bytes.length < 512 || !CFB_MAGIC.every((b, i) => bytes[i] === b)) return null;
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const shift = view.getUint16(0x1e, true);
  if (shift !== 9 && shift !== 12) return null;
  const sectorSize = 1 << shift;
  const perSector = sectorSize / 4;
  const sectorAt = (n: number) => (n + 1) * sectorSize;
  const readable = (n: number) => n <= MAX_REGULAR_SECTOR && sectorAt(n) + sectorSize <= bytes.length;

  // Where the FAT sectors are: 109 in the header, the rest in a chain of DIFAT sectors.
  const fatSectors: number[] = [];
  for (let i = 0; i < HEADER_DIFAT_ENTRIES; i++) fatSectors.push(view.getUint32(0x4c + i * 4, true));
  let difat = view.getUint32(0x44, true);
  for (let guard = view.getUint32(0x48, true); guard > 0 && readable(difat); guard--) {
    for (let i = 0; i < perSector - 1; i++) fatSectors.push(view.getUint32(sectorAt(difat) + i * 4, true));
    difat = view.getUint32(sectorAt(difat) + (perSector - 1) * 4, true);
  }
  const next = (sector: number): number => {
    const fatIndex = Math.floor(sector / perSector);
    const fatSector = fatSectors[fatIndex];
    if (fatSector === undefined || !readable(fatSector)) return ENDOFCHAIN;
    return view.getUint32(sectorAt(fatSector) + (sector % perSector) * 4, true);
  };

  const names: string[] = [];
  const visited = new Set<number>();
  for (let sector = view.getUint32(0x30, true); sector !== ENDOFCHAIN; sector = next(sector)) {
    if (!readable(sector) || visited.has(sector)) return names.length ? names : null;
    visited.add(sector);
    for (let at = sectorAt(sector); at < sectorAt(sector) + sectorSize; at += 128) {
      const nameLength = view.getUint16(at + 0x40, true);
      const type = bytes[at + 0x42];
      if (type === 0 || nameLength < 2 || nameLength > 64) continue;
      let name = "";
      for (let i = 0; i < nameLength - 2; i += 2) name += String.fromCharCode(view.getUint16(at + i, true));
      names.push(name);
    }
  }
  return names;
}
