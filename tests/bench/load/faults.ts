import type { Knex } from "knex";
import { HttpSession } from "../support/http-session";
import { SaveTracker, verifySaves, type Verification } from "./saves";

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
export type LoadEvent = {
  type: string;
  status?: number;
  message?: string;
  populationId?: number;
  rowCount?: number;
  phase?: string;
  rowsRead?: number;
};

/** Starts a load and returns its events as they come, and a promise of the last one (or the transport error). */
export function startLoad(session: HttpSession, base: string, uploadId: number, name: string) {
  const events: LoadEvent[] = [];
  const started = performance.now();
  const done = session
    .ndjson<LoadEvent>(
      `${base}/populations/uploads/${uploadId}/load`,
      { name, mapping: { itemRefColumn: "Invoice", bookValueColumn: "Amount", descriptionColumn: "Customer" } },
      (e) => events.push(e),
    )
    .then(() => ({ last: events.at(-1) ?? null, error: null as string | null, ms: performance.now() - started }))
    .catch((err: unknown) => ({
      last: events.at(-1) ?? null,
      error: String(err).slice(0, 200),
      ms: performance.now() - started,
    }));
  return { events, done };
}

/** Polls `path` until it answers `status`; the milliseconds that took, or NaN after `timeoutMs`. */
export async function until(
  session: HttpSession,
  path: string,
  status: number,
  timeoutMs = 60_000,
): Promise<{ ms: number; body: string }> {
  const start = performance.now();
  while (performance.now() - start < timeoutMs) {
    try {
      const res = await session.fetch(path);
      const body = await res.text();
      if (res.status === status) return { ms: performance.now() - start, body };
    } catch {
      /* the app itself may be restarting */
    }
    await sleep(100);
  }
  return { ms: Number.NaN, body: "" };
}

export interface PopulationCheck {
  before: number;
  after: number;
  newPopulations: { id: number; rowCount: number; items: number }[];
}

export async function populationsSince(
  db: Knex,
  engagementId: number,
  beforeMaxId: number,
): Promise<PopulationCheck["newPopulations"]> {
  const rows = await db("populations")
    .where("engagement_id", engagementId)
    .andWhere("id", ">", beforeMaxId)
    .select("id", "row_count");
  const out = [];
  for (const r of rows) {
    const [c] = await db("population_items").where({ population_id: r.id }).count({ n: "*" });
    out.push({ id: Number(r.id), rowCount: Number(r.row_count), items: Number(c.n) });
  }
  return out;
}

export async function maxPopulationId(db: Knex): Promise<number> {
  const [r] = await db("populations").max({ m: "id" });
  return Number(r.m ?? 0);
}

/** A database server the fault runs can kill (SIGKILL) and start again: the private server, or one Galera node. */
export interface KillableDatabase {
  kill(): Promise<void>;
  start(): Promise<void>;
}

/**
 * 50 save loops on one sample for `totalMs`; the database is SIGKILLed at `killAtMs` and started
 * again at `restartAtMs`. Every answer is counted; the acknowledged saves are verified afterwards.
 */
export async function burstWithKill(a: {
  sessions: HttpSession[];
  base: string;
  sampleId: number;
  items: { id: number; version: number }[];
  dbServer: KillableDatabase;
  db: () => Knex;
  totalMs: number;
  killAtMs: number;
  restartAtMs: number;
}) {
  const tracker = new SaveTracker(a.items);
  const initial = new Map(a.items.map((i) => [i.id, i.version]));
  const start = performance.now();
  let networkErrors = 0,
    firstUnavailableMs = Number.NaN,
    firstOkAfterRestartMs = Number.NaN;
  const slowDuringOutage: number[] = [];
  const killer = (async () => {
    await sleep(a.killAtMs);
    await a.dbServer.kill();
    await sleep(a.restartAtMs - a.killAtMs);
    await a.dbServer.start();
  })();
  await Promise.all(
    a.sessions.map(async (s) => {
      while (performance.now() - start < a.totalMs) {
        const save = tracker.next();
        const sentAt = performance.now();
        try {
          const res = await s.fetch(`${a.base}/samples/${a.sampleId}/items/${save.itemId}`, {
            method: "PATCH",
            headers: { "content-type": "application/json" },
            body: save.body,
          });
          const body = await res.text();
          tracker.answer(res.status, body, save);
          const at = performance.now() - start;
          if (res.status === 503 && Number.isNaN(firstUnavailableMs)) firstUnavailableMs = at - a.killAtMs;
          if (res.status === 503) slowDuringOutage.push(performance.now() - sentAt);
          if (res.status === 200 && at > a.restartAtMs && Number.isNaN(firstOkAfterRestartMs))
            firstOkAfterRestartMs = at - a.restartAtMs;
        } catch {
          networkErrors++;
        }
        if (tracker.ledger.unavailable > 0 && performance.now() - start < a.restartAtMs) await sleep(50);
      }
    }),
  );
  await killer;
  const db = a.db();
  const verification: Verification = await verifySaves(db, {
    sampleId: a.sampleId,
    initial,
    acks: tracker.ledger.acks,
  }).finally(() => db.destroy());
  slowDuringOutage.sort((x, y) => x - y);
  return {
    ledger: tracker.ledger,
    verification,
    networkErrors,
    firstUnavailableMs,
    firstOkAfterRestartMs,
    outageAnswerP50: slowDuringOutage[Math.floor(slowDuringOutage.length / 2)] ?? Number.NaN,
  };
}
