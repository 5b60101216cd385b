// Usage: tsx db/seed.ts — loads the demo scenario into the database named by DB_NAME (once).
import knex from "knex";
import { loadLocalEnv } from "./load-env";
import { buildKnexConfig } from "./knex-config";
import { seedDemo } from "./seeds/seed-demo";

async function main() {
  loadLocalEnv();
  const db = knex(buildKnexConfig());
  try {
    const result = await seedDemo(db);
    console.log(
      result === "seeded" ? "seed: demo firm, clients and people loaded" : "seed: data already present, left alone",
    );
  } finally {
    await db.destroy();
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
