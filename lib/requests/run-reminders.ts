// Usage: npm run job:request-reminders [-- YYYY-MM-DD] — the daily digest of overdue client requests
// (to each client contact and each senior who sent a list). Run it once a day from the scheduler;
// a second run on the same day sends nothing new. Runs with the react-server condition so the
// server-only modules it shares with the app load outside Next.
import { loadLocalEnv } from "../../db/load-env";

async function main() {
  loadLocalEnv();
  const [{ getDb }, { runRequestReminders }, { closeMailer }, { deliverDueMail }] = await Promise.all([
    import("../../db/knex"),
    import("./reminders"),
    import("../mail/transport"),
    import("../mail/outbox-worker"),
  ]);
  const today = process.argv[2];
  const real = (d: string) =>
    /^\d{4}-\d{2}-\d{2}$/.test(d) &&
    !Number.isNaN(Date.parse(`${d}T00:00:00Z`)) &&
    new Date(`${d}T00:00:00Z`).toISOString().startsWith(d);
  if (today !== undefined && !real(today))
    throw new Error(`the day must be a real date written YYYY-MM-DD, not "${today}"`);
  const db = getDb();
  try {
    const { lists, messages } = await runRequestReminders(db, today ? { today } : {});
    const failed = messages.filter((m) => !m.sent);
    // Queued in the outbox; deliver them now too (the app servers' workers would pick them up anyway).
    const delivered = await deliverDueMail(db);
    console.log(
      `request reminders: ${lists} overdue list(s), ${messages.length - failed.length} message(s) queued${failed.length ? `, ${failed.length} failed: ${failed.map((f) => f.to).join(", ")}` : ""}; outbox: ${delivered.sent} sent, ${delivered.refused} refused (retried later)`,
    );
    if (failed.length) process.exitCode = 1;
  } finally {
    await db.destroy();
    closeMailer();
  }
}

main().catch((err: unknown) => {
  console.error("request reminders:", err instanceof Error ? err.message : err);
  process.exit(1);
});
