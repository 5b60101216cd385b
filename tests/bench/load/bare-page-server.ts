/**
 * The reference for `npm run bench:load`'s paging figures: a bare Node HTTP handler running only the
 * keyset query of the app's population-items route (the same `seekPage` of lib/data/keyset.ts, the
 * same columns, the same pool size) and answering the same JSON shape — without Next, the session,
 * the membership and role checks, the population lookup or the stored row count. The bench prints
 * ours / bare.
 * Usage: tsx --conditions=react-server tests/bench/load/bare-page-server.ts <port>
 *   GET /populations/:id/items?sort=row|ref|book&dir=asc|desc&pageSize=n&after=<cursor>
 */
import http from "node:http";
import knex from "knex";
import { buildKnexConfig } from "../../../db/knex-config";
import { seekPage } from "../../../lib/data/keyset";
import { decodeCursor } from "../../../lib/validation/keyset";

const port = Number(process.argv[2]);
const db = knex(buildKnexConfig(process.env));
const SORT_COLUMNS = { row: "row_number", ref: "item_ref", book: "book_value" } as const;

async function page(populationId: number, params: URLSearchParams) {
  const column = SORT_COLUMNS[(params.get("sort") ?? "row") as keyof typeof SORT_COLUMNS] ?? "row_number";
  const dir = params.get("dir") === "desc" ? "desc" : "asc";
  const pageSize = Number(params.get("pageSize") ?? 50);
  const after = params.get("after") ? decodeCursor(params.get("after")!) : null;
  const rows = db("population_items")
    .where({ population_id: populationId })
    .select("row_number", "item_ref", "description", "book_value", "item_date", "extra");
  const result = await seekPage<Record<string, unknown>>(
    rows,
    { column, key: "row_number", dir },
    after ? { kind: "after", cursor: after } : { kind: "first" },
    pageSize,
    (r) => ({
      value: column === "row_number" ? Number(r.row_number) : String(r[column]),
      key: Number(r.row_number),
    }),
  );
  return {
    items: result.rows.map((r) => ({
      rowNumber: Number(r.row_number),
      itemRef: String(r.item_ref),
      description: r.description ?? null,
      bookValue: String(r.book_value),
      itemDate: r.item_date ?? null,
      extra: typeof r.extra === "string" ? (JSON.parse(r.extra) as unknown) : (r.extra ?? null),
    })),
    nextCursor: result.nextCursor,
    prevCursor: result.prevCursor,
  };
}

const server = http.createServer((req, res) => {
  const url = new URL(req.url ?? "/", "http://127.0.0.1");
  if (url.pathname === "/health") return void res.end("ok");
  const match = /^\/populations\/(\d+)\/items$/.exec(url.pathname);
  if (req.method !== "GET" || !match) {
    res.statusCode = 404;
    return void res.end();
  }
  page(Number(match[1]), url.searchParams).then(
    (body) => {
      res.setHeader("content-type", "application/json");
      res.end(JSON.stringify(body));
    },
    (err: unknown) => {
      res.statusCode = 500;
      res.end(String(err));
    },
  );
});
server.listen(port, "127.0.0.1");
process.on("SIGTERM", () => {
  server.close();
  void db.destroy();
});
