import "server-only";
import type { Knex } from "knex";
import type { ItemsQuery } from "@/lib/validation/population";
import { containsPattern } from "./like";
import type { PopulationItemsRow } from "./tables";
import { parseJsonColumn } from "./json-column";
import { StoredExtraSchema } from "./upload-schemas";
import { seekFromQuery, seekPage } from "./keyset";
import type { KeysetPage } from "@/lib/validation/keyset";
import type { Readable } from "node:stream";
import { withLoadStream } from "@/db/knex-bulk-load";
import { LOAD_DATA_COLUMNS, LOAD_DATA_FORMAT_CLAUSE } from "@/lib/imports/load-data-tsv";

export interface PopulationItem {
  rowNumber: number;
  itemRef: string;
  description: string | null;
  bookValue: string;
  itemDate: string | null;
  extra: Record<string, string> | null;
}

const toItem = (r: Record<string, unknown> | PopulationItemsRow): PopulationItem => ({
  rowNumber: Number(r.row_number),
  itemRef: String(r.item_ref),
  description: (r.description as string | null) ?? null,
  bookValue: String(r.book_value),
  itemDate: (r.item_date as string | null) ?? null,
  extra: parseJsonColumn(StoredExtraSchema, r.extra ?? null, "population_items.extra", Number(r.row_number)),
});

const SORT_COLUMNS = { row: "row_number", ref: "item_ref", book: "book_value" } as const;

/**
 * One page of a population's items, sorted and optionally searched (reference or description),
 * paged by key: the sort column plus the row number, through the (population_id, column) index,
 * so a deep page costs what the first does. Unsearched, the total is the population's row count
 * stored at load (no COUNT over a million rows; given `rowCount` from the population already read, no query at all).
 */
export async function listItemsByPopulationId(
  db: Knex,
  { populationId, rowCount, query }: { populationId: number; rowCount?: number; query: ItemsQuery },
): Promise<KeysetPage<PopulationItem>> {
  const base = db("population_items").where({ population_id: populationId });
  if (query.q) {
    const like = containsPattern(query.q);
    base.andWhere((w) => {
      w.where("item_ref", "like", like).orWhere("description", "like", like);
    });
  }
  const total = query.q
    ? Number((await base.clone().count({ n: "*" }).first())?.n ?? 0)
    : (rowCount ?? Number((await db("populations").where({ id: populationId }).first("row_count"))?.row_count ?? 0));
  const column = SORT_COLUMNS[query.sort];
  const rows = base.clone().select("row_number", "item_ref", "description", "book_value", "item_date", "extra");
  const page = await seekPage<Record<string, unknown>>(
    rows,
    { column, key: "row_number", dir: query.dir },
    seekFromQuery(query, total),
    query.pageSize,
    (r) => ({
      value:
        column === "book_value"
          ? String(r.book_value)
          : column === "item_ref"
            ? String(r.item_ref)
            : Number(r.row_number),
      key: Number(r.row_number),
    }),
  );
  const pageNumber = query.last ? Math.max(1, Math.ceil(total / query.pageSize)) : query.page;
  return {
    items: page.rows.map(toItem),
    total,
    page: pageNumber,
    pageSize: query.pageSize,
    nextCursor: page.nextCursor,
    prevCursor: page.prevCursor,
  };
}

export interface PopulationProfile {
  largest: PopulationItem[];
  duplicates: { itemRef: string; count: number; total: string }[];
  duplicateRefCount: number;
  strata: { label: string; from: string | null; to: string | null; count: number; total: string }[];
  threshold: { amount: string; count: number; total: string } | null;
}

/** Book-value bands on a log scale: a band per power of ten, with zeros and negatives on their own. */
function bandLabel(exponent: number): { label: string; from: string; to: string } {
  const from = 10 ** exponent;
  const to = 10 ** (exponent + 1);
  const fmt = (v: number) => (v < 1 ? v.toFixed(2) : v.toLocaleString("en-US"));
  return { label: `${fmt(from)} – ${fmt(to)}`, from: from.toFixed(2), to: to.toFixed(2) };
}

export async function getPopulationProfile(
  db: Knex,
  { populationId, threshold }: { populationId: number; threshold?: string },
): Promise<PopulationProfile> {
  const items = () => db("population_items").where({ population_id: populationId });
  const [largest, duplicates, duplicateCount, bands, signs, above] = await Promise.all([
    items().orderBy("book_value", "desc").limit(10).select("*"),
    items()
      .groupBy("item_ref")
      .havingRaw("count(*) > 1")
      .orderByRaw("count(*) desc, item_ref")
      .limit(50)
      .select("item_ref")
      .count({ n: "*" })
      .sum({ total: "book_value" }),
    db.from(items().groupBy("item_ref").havingRaw("count(*) > 1").select("item_ref").as("d")).count({ n: "*" }).first(),
    items()
      .where("book_value", ">", 0)
      .groupByRaw("floor(log10(book_value))")
      .orderByRaw("floor(log10(book_value))")
      .select(db.raw("floor(log10(book_value)) as e"))
      .count({ n: "*" })
      .sum({ total: "book_value" }),
    items()
      .where("book_value", "<=", 0)
      .groupByRaw("sign(book_value)")
      .select(db.raw("sign(book_value) as s"))
      .count({ n: "*" })
      .sum({ total: "book_value" }),
    threshold
      ? items().where("book_value", ">=", threshold).count({ n: "*" }).sum({ total: "book_value" }).first()
      : Promise.resolve(null),
  ]);
  const strata: PopulationProfile["strata"] = [];
  for (const s of signs as Record<string, unknown>[]) {
    strata.push(
      Number(s.s) < 0
        ? { label: "Negative (credits)", from: null, to: "0.00", count: Number(s.n), total: String(s.total) }
        : { label: "Zero", from: "0.00", to: "0.00", count: Number(s.n), total: "0.00" },
    );
  }
  for (const b of bands as Record<string, unknown>[])
    strata.push({ ...bandLabel(Number(b.e)), count: Number(b.n), total: String(b.total) });
  return {
    largest: largest.map(toItem),
    duplicates: (duplicates as Record<string, unknown>[]).map((d) => ({
      itemRef: String(d.item_ref),
      count: Number(d.n),
      total: String(d.total),
    })),
    duplicateRefCount: Number((duplicateCount as { n?: unknown } | undefined)?.n ?? 0),
    strata,
    threshold:
      threshold && above ? { amount: threshold, count: Number(above.n), total: String(above.total ?? "0.00") } : null,
  };
}

/** The sampling frame's columns of every item, in file order (row number). */
export async function listFrameRowsByPopulationId(
  db: Knex | Knex.Transaction,
  { populationId }: { populationId: number },
): Promise<Pick<PopulationItemsRow, "row_number" | "item_ref" | "book_value">[]> {
  return db("population_items")
    .where({ population_id: populationId })
    .orderBy("row_number")
    .select("row_number", "item_ref", "book_value");
}

/** The descriptions of the given rows, by row number (rows without one map to null). */
export async function listDescriptionsByRowNumbers(
  db: Knex | Knex.Transaction,
  { populationId, rowNumbers }: { populationId: number; rowNumbers: number[] },
): Promise<Map<number, string | null>> {
  const rows = await db("population_items")
    .where({ population_id: populationId })
    .whereIn("row_number", rowNumbers)
    .select("row_number", "description");
  return new Map(rows.map((r) => [r.row_number, r.description]));
}

/**
 * Streams a validated file into population_items with LOAD DATA LOCAL INFILE on the bulk-load
 * connection (db/knex-bulk-load.ts): the fast path for a million rows. `openStream` gives the
 * tab-separated lines (lib/imports/load-data-tsv.ts); the result counts the rows the server stored
 * and its warnings.
 */
export async function loadItemsByPopulationId(
  trx: Knex.Transaction,
  { populationId, openStream }: { populationId: number; openStream: () => Readable },
): Promise<{ affectedRows: number; warningStatus: number }> {
  const sql = `LOAD DATA LOCAL INFILE 'upload' INTO TABLE population_items ${LOAD_DATA_FORMAT_CLAUSE} (${LOAD_DATA_COLUMNS.map((c) => `\`${c}\``).join(", ")}) SET population_id = ?`;
  const [loaded] = await withLoadStream(openStream, () =>
    trx.raw<[{ affectedRows: number; warningStatus: number }]>(sql, [populationId]),
  );
  return loaded;
}

/** The first few warnings of the last statement on this connection (for the log). */
export async function listLoadWarnings(trx: Knex.Transaction): Promise<unknown> {
  const [warnings] = await trx.raw<[unknown]>("SHOW WARNINGS LIMIT 5");
  return warnings;
}

export async function deleteItemsByPopulationId(trx: Knex.Transaction, { populationId }: { populationId: number }) {
  await trx("population_items").where({ population_id: populationId }).delete();
}
