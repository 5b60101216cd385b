// Usage: tsx db/migrate.ts latest | rollback | rollback-all | recreate
// "recreate" drops and recreates the database named by DB_NAME first (tests only: refuses "sondage").
import knex from "knex";
import { loadLocalEnv } from "./load-env";
import { buildKnexConfig } from "./knex-config";
import { recreateDatabase } from "./recreate-database";

async function main(command: string): Promise<void> {
  loadLocalEnv();
  if (command === "recreate") await recreateDatabase(process.env.DB_NAME ?? "");
  const db = knex(buildKnexConfig());
  try {
    if (command === "latest" || command === "recreate") {
      const [, applied] = await db.migrate.latest();
      console.log(`migrate: ${applied.length ? applied.join(", ") : "already up to date"}`);
    } else if (command === "rollback" || command === "rollback-all") {
      const [, undone] = await db.migrate.rollback(undefined, command === "rollback-all");
      console.log(`migrate: rolled back ${undone.length ? undone.join(", ") : "nothing"}`);
    } else {
      throw new Error(`unknown command "${command}" (latest, rollback, rollback-all, recreate)`);
    }
  } finally {
    await db.destroy();
  }
}

main(process.argv[2] ?? "latest").catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
