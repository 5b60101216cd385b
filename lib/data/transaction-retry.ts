import "server-only";
import type { Knex } from "knex";

/** Retries after a deadlock before giving up (each retry runs the whole transaction again). */
export const DEADLOCK_ATTEMPTS = 4;

const counter = globalThis as unknown as { sondageDeadlockRetries?: number };

/** Transactions re-run in this process after ER_LOCK_DEADLOCK (1213), for benchmarks and logs. */
export const deadlockRetries = () => counter.sondageDeadlockRetries ?? 0;

/** True for MariaDB's deadlock, which Galera also answers for a certification conflict at commit. */
export function isDeadlock(err: unknown): boolean {
  for (let e: unknown = err, depth = 0; e && depth < 4; depth++) {
    const { errno, code } = e as { errno?: unknown; code?: unknown };
    if (errno === 1213 || code === "ER_LOCK_DEADLOCK") return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}

/**
 * db.transaction(work), run again from the start when the database chose it as a deadlock victim
 * or (on a Galera cluster) it lost a certification conflict — both 1213, both rolled back whole —
 * at most DEADLOCK_ATTEMPTS times, with a short random pause. `work` must be safe to re-run: it
 * reads what it needs inside the transaction (a save re-checks the item's version, so a retry
 * can never apply a stale change). Each retry logs one line (`npm run bench:load` counts them).
 */
export async function transactionWithRetry<T>(db: Knex, work: (trx: Knex.Transaction) => Promise<T>): Promise<T> {
  // Inside a caller's transaction a deadlock has rolled back the caller's work too: only the caller may retry.
  if ((db as Knex.Transaction).isTransaction) return db.transaction(work);
  for (let attempt = 1; ; attempt++) {
    try {
      return await db.transaction(work);
    } catch (err) {
      if (!isDeadlock(err) || attempt >= DEADLOCK_ATTEMPTS) throw err;
      counter.sondageDeadlockRetries = deadlockRetries() + 1;
      console.warn(
        `[sondage] deadlock retry: transaction re-run after 1213 (attempt ${attempt + 1} of ${DEADLOCK_ATTEMPTS})`,
      );
      await new Promise((r) => setTimeout(r, 5 + Math.random() * 20 * attempt));
    }
  }
}
