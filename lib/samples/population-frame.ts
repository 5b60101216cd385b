import "server-only";
import type { Knex } from "knex";
import { decimalToCents } from "@/lib/money";
import { listFrameRowsByPopulationId } from "@/lib/data/population-items";

/** A population's items in file order — the sampling frame every selection is drawn from. */
export interface Frame {
  populationId: number;
  rowNumbers: Int32Array;
  itemRefs: string[];
  bookValues: number[];
  bookCents: bigint[];
  totalCents: bigint;
}

// Populations never change once loaded, so a frame can be cached safely by id.
const cache = new Map<number, Frame>();
const CACHE_SIZE = 4;

export async function loadFrame(db: Knex, { populationId }: { populationId: number }): Promise<Frame> {
  const hit = cache.get(populationId);
  if (hit) return hit;
  const rows = await listFrameRowsByPopulationId(db, { populationId });
  const frame: Frame = {
    populationId,
    rowNumbers: Int32Array.from(rows, (r) => r.row_number),
    itemRefs: rows.map((r) => r.item_ref),
    bookValues: rows.map((r) => Number(r.book_value)),
    bookCents: rows.map((r) => decimalToCents(r.book_value)),
    totalCents: 0n,
  };
  frame.totalCents = frame.bookCents.reduce((a, b) => a + b, 0n);
  cache.set(populationId, frame);
  if (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value as number);
  return frame;
}
