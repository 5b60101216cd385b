import type { Knex } from "knex";
import { readDatabaseSettings } from "./config";
import { migrationSource } from "./migrations";

/** The one Knex configuration: the app, the scripts and the tests all build from this. */
export function buildKnexConfig(env: NodeJS.ProcessEnv = process.env): Knex.Config {
  const db = readDatabaseSettings(env);
  return {
    client: "mysql2",
    connection: {
      host: db.DB_HOST,
      port: db.DB_PORT,
      user: db.DB_USER,
      password: db.DB_PASSWORD,
      database: db.DB_NAME,
      charset: "utf8mb4",
      timezone: "Z",
      // Calendar dates (period ends) stay "YYYY-MM-DD" strings; timestamps become Dates (UTC).
      typeCast: (field: { type: string; string(): string | null }, next: () => unknown) =>
        field.type === "DATE" ? field.string() : next(),
      supportBigNumbers: true,
      bigNumberStrings: true,
    },
    pool: { min: 0, max: 10 },
    // When the server is down, a request waits this long for a connection, then answers 503 (lib/errors.ts).
    acquireConnectionTimeout: 5_000,
    migrations: { migrationSource, tableName: "knex_migrations" },
  };
}
