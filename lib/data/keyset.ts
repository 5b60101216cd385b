import "server-only";
import type { Knex } from "knex";
import { encodeCursor, type Cursor, type CursorValue } from "@/lib/validation/keyset";

/** How a grid is ordered: a sort column, and a unique key that breaks ties (it may be the same column). */
export interface SeekOrder {
  column: string;
  key: string;
  dir: "asc" | "desc";
}

/** Where a page starts: the first page, after/before a cursor, the last page (with its row count), or a plain offset. */
export type SeekFrom =
  | { kind: "first" }
  | { kind: "after"; cursor: Cursor }
  | { kind: "before"; cursor: Cursor }
  | { kind: "last"; rows: number; hasEarlier: boolean }
  | { kind: "offset"; offset: number };

/** Where the page starts, from the query: a cursor, the last page, or (no cursor) the page number as an offset. */
export function seekFromQuery(
  query: { after?: Cursor; before?: Cursor; last: boolean; page: number; pageSize: number },
  total: number,
): SeekFrom {
  if (query.after) return { kind: "after", cursor: query.after };
  if (query.before) return { kind: "before", cursor: query.before };
  if (query.last) {
    const pages = Math.max(1, Math.ceil(total / query.pageSize));
    return { kind: "last", rows: total - (pages - 1) * query.pageSize, hasEarlier: pages > 1 };
  }
  return query.page > 1 ? { kind: "offset", offset: (query.page - 1) * query.pageSize } : { kind: "first" };
}

const flip = (dir: "asc" | "desc") => (dir === "asc" ? "desc" : "asc");

/** Rows strictly beyond the cursor in the given direction: `col > v OR (col = v AND key > k)`, written so the index range applies. */
function beyond(query: Knex.QueryBuilder, order: SeekOrder, dir: "asc" | "desc", cursor: Cursor): void {
  const op = dir === "asc" ? ">" : "<";
  if (order.column === order.key) {
    query.andWhere(order.key, op, cursor.key);
    return;
  }
  query.andWhere(order.column, `${op}=`, cursor.value).andWhere((w) => {
    w.where(order.column, op, cursor.value).orWhere(order.key, op, cursor.key);
  });
}

export interface SeekResult<R> {
  rows: R[];
  nextCursor: string | null;
  prevCursor: string | null;
}

/**
 * One page of `query` by keyset: the query must already hold its filters and select; this adds the
 * seek condition, the order and the limit. `cursorOf` reads a row's sort value and key.
 */
export async function seekPage<R>(
  query: Knex.QueryBuilder,
  order: SeekOrder,
  from: SeekFrom,
  pageSize: number,
  cursorOf: (row: R) => { value: CursorValue; key: number },
): Promise<SeekResult<R>> {
  const backward = from.kind === "before" || from.kind === "last";
  const dir = backward ? flip(order.dir) : order.dir;
  if (from.kind === "after") beyond(query, order, dir, from.cursor);
  if (from.kind === "before") beyond(query, order, dir, from.cursor);
  if (order.column !== order.key) query.orderBy(order.column, dir);
  query.orderBy(order.key, dir);
  const want = from.kind === "last" ? Math.max(0, Math.min(from.rows, pageSize)) : pageSize;
  query.limit(from.kind === "last" ? want : pageSize + 1);
  if (from.kind === "offset" && from.offset > 0) query.offset(from.offset);
  const fetched = (from.kind === "last" && want === 0 ? [] : await query) as R[];
  const more = fetched.length > want;
  const rows = more ? fetched.slice(0, want) : fetched;
  if (backward) rows.reverse();
  const cursor = (row: R | undefined) => (row === undefined ? null : encodeCursor(cursorOf(row)));
  if (backward) {
    const hasPrev = from.kind === "before" ? more : from.hasEarlier;
    return {
      rows,
      prevCursor: hasPrev ? cursor(rows[0]) : null,
      nextCursor: from.kind === "before" ? cursor(rows.at(-1)) : null,
    };
  }
  const hasPrev = from.kind === "after" || (from.kind === "offset" && from.offset > 0);
  return { rows, nextCursor: more ? cursor(rows.at(-1)) : null, prevCursor: hasPrev ? cursor(rows[0]) : null };
}
