import knex, { type Knex } from "knex";
import { buildKnexConfig } from "./knex-config";

const globalForDb = globalThis as unknown as { sondageDb?: Knex };

/** The application's single Knex pool, built once per process (kept across dev reloads). */
export function getDb(): Knex {
  if (!globalForDb.sondageDb) globalForDb.sondageDb = knex(buildKnexConfig());
  return globalForDb.sondageDb;
}

export type { Knex };
