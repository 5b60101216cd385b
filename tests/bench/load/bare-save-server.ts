/**
 * The reference for `npm run bench:load`'s save figures: a bare Node HTTP handler doing the same
 * single-row transaction as the app's save (lock the item, check its version, update it, read it
 * back, commit) on the same database and the same pool size — without Next, the session, the
 * engagement and role checks, the sign-off guard or the audit row. The bench prints ours / bare.
 * Usage: tsx tests/bench/load/bare-save-server.ts <port>   (database settings from the environment)
 */
import http from "node:http";
import knex from "knex";
import { buildKnexConfig } from "../../../db/knex-config";

const port = Number(process.argv[2]);
const db = knex(buildKnexConfig(process.env));

async function save(
  itemId: number,
  input: { version: number; status: "not-started" | "done" | "not-auditable"; auditedValue: string; comment?: string },
) {
  return db.transaction(async (trx) => {
    const before = await trx("sample_items").where({ id: itemId }).forUpdate().first("version");
    if (!before) return { status: 404, body: { error: "no such item" } };
    if (Number(before.version) !== input.version) return { status: 409, body: { error: "stale" } };
    await trx("sample_items")
      .where({ id: itemId })
      .update({
        status: input.status,
        audited_value: input.auditedValue,
        comment: input.comment ?? null,
        version: input.version + 1,
        updated_at: trx.fn.now(3),
      });
    const after = (await trx("sample_items").where({ id: itemId }).first("id", "version", "audited_value"))!;
    return {
      status: 200,
      body: {
        item: { id: Number(after.id), version: Number(after.version), auditedValue: String(after.audited_value) },
      },
    };
  });
}

const server = http.createServer((req, res) => {
  const match = /^\/items\/(\d+)$/.exec(req.url ?? "");
  if (req.method === "GET" && req.url === "/health") return void res.end("ok");
  if (req.method !== "PATCH" || !match) {
    res.statusCode = 404;
    return void res.end();
  }
  const chunks: Buffer[] = [];
  req.on("data", (c: Buffer) => chunks.push(c));
  req.on("end", () => {
    save(Number(match[1]), JSON.parse(Buffer.concat(chunks).toString("utf8")) as Parameters<typeof save>[1]).then(
      (r) => {
        res.statusCode = r.status;
        res.setHeader("content-type", "application/json");
        res.end(JSON.stringify(r.body));
      },
      (err: unknown) => {
        res.statusCode = 500;
        res.end(String(err));
      },
    );
  });
});
server.listen(port, "127.0.0.1");
process.on("SIGTERM", () => {
  server.close();
  void db.destroy();
});
