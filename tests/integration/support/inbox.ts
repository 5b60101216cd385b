import type { CaughtMessage } from "@/lib/fakes/smtp-fake";
import { TEST_ENV } from "../test-env";

const inboxUrl = `http://127.0.0.1:${TEST_ENV.MAIL_INBOX_PORT}`;

/** Every message the run's SMTP fake has caught, newest first. */
export async function readInbox(): Promise<CaughtMessage[]> {
  const res = await fetch(`${inboxUrl}/messages`);
  if (!res.ok) throw new Error(`mail inbox answered ${res.status}`);
  return (await res.json()) as CaughtMessage[];
}

export async function clearInbox(): Promise<void> {
  const res = await fetch(`${inboxUrl}/messages`, { method: "DELETE" });
  if (!res.ok) throw new Error(`mail inbox answered ${res.status} to DELETE`);
}

/** Polls the inbox until a message matches; fails naming what did arrive. */
export async function waitForMessage(
  predicate: (m: CaughtMessage) => boolean,
  timeoutMs = 5_000,
): Promise<CaughtMessage> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const messages = await readInbox();
    const found = messages.find(predicate);
    if (found) return found;
    if (Date.now() > deadline) {
      const seen = messages.map((m) => `${m.to.join(",")}: ${m.subject}`).join("; ") || "nothing";
      throw new Error(`no matching message within ${timeoutMs} ms (inbox holds: ${seen})`);
    }
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** Messages addressed to one person. */
export const addressedTo = (email: string) => (m: CaughtMessage) =>
  m.to.some((a) => a.toLowerCase() === email.toLowerCase());
