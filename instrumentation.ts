/**
 * Runs once when a Next server process starts. On the Node runtime it starts this server's mail
 * outbox worker (lib/mail/outbox-worker.ts): every app server runs one, and their claims never
 * overlap, so two servers never send the same message. MAIL_WORKER=off leaves it out (a server
 * that should only answer requests).
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs" || process.env.MAIL_WORKER === "off") return;
  const [{ getDb }, { startMailWorker }] = await Promise.all([import("@/db/knex"), import("@/lib/mail/outbox-worker")]);
  startMailWorker(getDb, { intervalMs: Number(process.env.MAIL_WORKER_INTERVAL_MS ?? 2_000) });
}
