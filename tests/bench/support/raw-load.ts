import path from "node:path";
import { cpuSeconds } from "./cpu-time";
import { run } from "./processes";

export interface MariaDbClient {
  socket: string;
  user: string;
  password: string;
  database: string;
}

/** Runs SQL through Debian's mariadb client on the private server's socket (password via MYSQL_PWD). */
export function mariadb(c: MariaDbClient, sql: string, extraArgs: string[] = []): Promise<string> {
  return run(
    "mariadb",
    [
      "--no-defaults",
      ...extraArgs,
      `--socket=${c.socket}`,
      "-u",
      c.user,
      "--batch",
      "--skip-column-names",
      c.database,
      "-e",
      sql,
    ],
    { ...process.env, MYSQL_PWD: c.password },
  );
}

/** Same column types and indexes as population_items (db/migrations/20261202_0004_populations.ts). */
const SCRATCH_TABLE = `
  DROP TABLE IF EXISTS bench_scratch;
  CREATE TABLE bench_scratch (
    population_id INT UNSIGNED NOT NULL,
    \`row_number\` INT UNSIGNED NOT NULL,
    item_ref VARCHAR(255) NOT NULL,
    description TEXT NULL,
    book_value DECIMAL(18,2) NOT NULL,
    item_date DATE NULL,
    extra JSON NULL,
    PRIMARY KEY (population_id, \`row_number\`),
    KEY population_items_ref (population_id, item_ref),
    KEY population_items_book_value (population_id, book_value)
  ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci;`;

/**
 * The raw baseline: the mariadb client's LOAD DATA LOCAL INFILE of the same CSV into a fresh
 * scratch table, storing the same fields our import stores (ref, description, date, amount, and
 * the other two columns as JSON). Returns seconds (and the server's CPU seconds) for the LOAD DATA statement alone, and its row count.
 */
export async function rawLoad(
  c: MariaDbClient,
  csvPath: string,
  lineEnding: "\n" | "\r\n",
  dbPid: number,
): Promise<{ seconds: number; dbCpuS: number; rows: number; warnings: string }> {
  await mariadb(c, SCRATCH_TABLE);
  const file = path.resolve(csvPath).replace(/\\/g, "\\\\").replace(/'/g, "\\'");
  const lines = lineEnding === "\r\n" ? "\\r\\n" : "\\n";
  const sql =
    `SET @n = 1; LOAD DATA LOCAL INFILE '${file}' INTO TABLE bench_scratch CHARACTER SET utf8mb4 ` +
    `FIELDS TERMINATED BY ',' OPTIONALLY ENCLOSED BY '"' ESCAPED BY '' LINES TERMINATED BY '${lines}' IGNORE 1 LINES ` +
    `(item_ref, description, item_date, @due, book_value, @currency) ` +
    `SET population_id = 1, \`row_number\` = (@n := @n + 1), extra = JSON_OBJECT('Due', @due, 'Currency', @currency); SHOW WARNINGS LIMIT 5;`;
  const cpu0 = cpuSeconds(dbPid);
  const start = performance.now();
  const warnings = await mariadb(c, sql, ["--local-infile=1"]);
  const seconds = (performance.now() - start) / 1000;
  const dbCpuS = cpuSeconds(dbPid) - cpu0;
  const rows = Number((await mariadb(c, "SELECT COUNT(*) FROM bench_scratch")).trim());
  await mariadb(c, "DROP TABLE bench_scratch");
  return { seconds, dbCpuS, rows, warnings: warnings.trim() };
}
