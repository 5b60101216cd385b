import knex, { type Knex } from "knex";
import { Readable } from "node:stream";
import { buildKnexConfig } from "./knex-config";

// The only connections allowed LOAD DATA LOCAL: a separate one-connection pool whose file
// requests are answered with the stream of the upload in hand and nothing else — never a path
// named by the query. One connection also means loads in one process run one after another.
let currentStream: (() => Readable) | null = null;

function refuse(): Readable {
  return new Readable({
    read() {
      this.destroy(new Error("LOAD DATA LOCAL refused: no upload is being loaded"));
    },
  });
}

const globalForBulk = globalThis as unknown as { sondageBulkDb?: Knex };

export function getBulkLoadDb(): Knex {
  if (!globalForBulk.sondageBulkDb) {
    const config = buildKnexConfig();
    globalForBulk.sondageBulkDb = knex({
      ...config,
      // mysql2 reads infileStreamFactory from its connection options; knex's types do not list it.
      connection: {
        ...(config.connection as object),
        flags: "+LOCAL_FILES",
        infileStreamFactory: () => (currentStream ?? refuse)(),
      } as unknown as Knex.MySql2ConnectionConfig,
      pool: { min: 0, max: 1 },
      // Loads queue for the one connection: wait as long as a load may run (maxDuration 600 s).
      acquireConnectionTimeout: 600_000,
    });
  }
  return globalForBulk.sondageBulkDb;
}

/** Runs `load` with `stream` as the only file this connection will serve; call inside the load's transaction. */
export async function withLoadStream<T>(stream: () => Readable, load: () => Promise<T>): Promise<T> {
  currentStream = stream;
  try {
    return await load();
  } finally {
    currentStream = null;
  }
}
