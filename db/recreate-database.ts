import knex from "knex";
import { buildKnexConfig } from "./knex-config";

/** Drops and recreates a test database on the private server. Never the product's own "sondage". */
export async function recreateDatabase(name: string): Promise<void> {
  if (!/^sondage_[a-z0-9]+$/.test(name))
    throw new Error(`refusing to recreate database "${name}": only sondage_<suffix> test databases`);
  const config = buildKnexConfig({ ...process.env, DB_NAME: name });
  const connection = { ...(config.connection as object), database: undefined };
  const admin = knex({ ...config, connection });
  try {
    await admin.raw("DROP DATABASE IF EXISTS ??", [name]);
    await admin.raw("CREATE DATABASE ?? CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci", [name]);
  } finally {
    await admin.destroy();
  }
}
