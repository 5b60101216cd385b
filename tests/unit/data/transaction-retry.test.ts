import type { Knex } from "knex";
import { describe, expect, it, vi } from "vitest";
import { DEADLOCK_ATTEMPTS, deadlockRetries, isDeadlock, transactionWithRetry } from "@/lib/data/transaction-retry";

// MariaDB error 1213 ER_LOCK_DEADLOCK, "Deadlock found when trying to get lock; try restarting
// transaction" (MariaDB error codes reference); Galera reports a certification conflict with it.
const deadlock = () =>
  Object.assign(new Error("Deadlock found when trying to get lock; try restarting transaction"), {
    errno: 1213,
    code: "ER_LOCK_DEADLOCK",
  });

/** A stand-in for knex whose transaction() runs the work with failures queued up front. */
function fakeDb(failures: Error[], isTransaction = false) {
  const runs: number[] = [];
  const db = {
    isTransaction,
    transaction: async <T>(work: (trx: Knex.Transaction) => Promise<T>) => {
      runs.push(runs.length + 1);
      const failure = failures.shift();
      if (failure) throw failure;
      return work({} as Knex.Transaction);
    },
  };
  return { db: db as unknown as Knex, runs };
}

describe("transactionWithRetry", () => {
  it("re-runs the whole transaction after a deadlock and counts each retry", async () => {
    vi.spyOn(console, "warn").mockImplementation(() => undefined);
    const before = deadlockRetries();
    const { db, runs } = fakeDb([deadlock(), deadlock()]);
    await expect(transactionWithRetry(db, () => Promise.resolve("saved"))).resolves.toBe("saved");
    expect(runs).toHaveLength(3);
    expect(deadlockRetries() - before).toBe(2);
  });

  it("gives up after DEADLOCK_ATTEMPTS runs, passing the deadlock on", async () => {
    vi.spyOn(console, "warn").mockImplementation(() => undefined);
    const { db, runs } = fakeDb(Array.from({ length: 10 }, deadlock));
    await expect(transactionWithRetry(db, () => Promise.resolve("never"))).rejects.toMatchObject({ errno: 1213 });
    expect(runs).toHaveLength(DEADLOCK_ATTEMPTS);
  });

  it("never retries other errors, nor inside a caller's transaction", async () => {
    const other = fakeDb([new Error("Duplicate entry")]);
    await expect(transactionWithRetry(other.db, () => Promise.resolve(1))).rejects.toThrow("Duplicate entry");
    expect(other.runs).toHaveLength(1);
    const nested = fakeDb([deadlock()], true);
    await expect(transactionWithRetry(nested.db, () => Promise.resolve(1))).rejects.toMatchObject({ errno: 1213 });
    expect(nested.runs).toHaveLength(1);
  });

  it("recognises the deadlock wrapped in a cause", () => {
    expect(isDeadlock(new Error("outer", { cause: deadlock() }))).toBe(true);
    expect(isDeadlock(Object.assign(new Error("lock wait timeout"), { errno: 1205 }))).toBe(false);
  });
});
