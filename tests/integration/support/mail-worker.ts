import { afterAll, beforeAll } from "vitest";
import { getDb } from "@/db/knex";
import { startMailWorker, type MailWorker } from "@/lib/mail/outbox-worker";

/**
 * Runs the outbox worker in this test file's process, as every app server does, polling fast so
 * waitForMessage sees mail within its timeout. Call it AFTER the file's own afterAll (vitest runs
 * after-hooks in reverse order), so the worker stops before that afterAll destroys the pool.
 */
export function runMailWorkerDuringTests(intervalMs = 100) {
  let worker: MailWorker | undefined;
  beforeAll(() => {
    worker = startMailWorker(() => getDb(), { intervalMs });
  });
  afterAll(async () => {
    await worker?.stop();
  });
}
