import knex from "knex";
import { loadLocalEnv } from "@/db/load-env";
import { buildKnexConfig } from "@/db/knex-config";
import { recreateDatabase } from "@/db/recreate-database";

/** Integration tests get their own database on the private server, recreated and migrated per run. */
export default async function setup() {
  loadLocalEnv();
  process.env.DB_NAME = "sondage_test";
  await recreateDatabase("sondage_test");
  const db = knex(buildKnexConfig());
  try {
    await db.migrate.latest();
  } finally {
    await db.destroy();
  }
}
