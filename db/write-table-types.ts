// Usage: tsx db/write-table-types.ts — migrates a scratch database (sondage_types) and writes lib/data/tables.ts.
import fs from "node:fs";
import path from "node:path";
import knex from "knex";
import { loadLocalEnv } from "./load-env";
import { buildKnexConfig } from "./knex-config";
import { recreateDatabase } from "./recreate-database";
import { renderTableTypes } from "./table-types";

const SCRATCH = "sondage_types";

async function main(): Promise<void> {
  loadLocalEnv();
  await recreateDatabase(SCRATCH);
  const db = knex(buildKnexConfig({ ...process.env, DB_NAME: SCRATCH }));
  try {
    await db.migrate.latest();
    const file = path.resolve(import.meta.dirname, "../lib/data/tables.ts");
    fs.writeFileSync(file, await renderTableTypes(db));
    console.log(`db:types: wrote ${path.relative(process.cwd(), file)}`);
  } finally {
    await db.raw(`DROP DATABASE IF EXISTS \`${SCRATCH}\``);
    await db.destroy();
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
