import "server-only";
import type { Knex } from "knex";
import { claimDueMail, markAbandonedSends, markMailRefused, markMailSent } from "@/lib/data/mail-outbox";
import { instanceId } from "@/lib/workers/instance-id";
import { getMailer } from "./transport";

const BATCH = 20;

/**
 * Sends the messages that are due, once each: claim (status sending) → send → sent, or back to
 * pending after a backoff when the relay refuses. Returns how many were sent and refused.
 * The Message-ID is derived from the outbox row, so a relay or mailbox that sees it twice can tell.
 */
export async function deliverDueMail(db: Knex): Promise<{ sent: number; refused: number; abandoned: number }> {
  const holder = instanceId();
  const abandoned = await markAbandonedSends(db);
  const due = await claimDueMail(db, { holder, limit: BATCH });
  let sent = 0,
    refused = 0;
  for (const m of due) {
    try {
      const { transporter, from } = getMailer();
      const messageId = `<outbox-${m.id}@sondage.mail>`;
      await transporter.sendMail({
        from,
        to: { name: m.toName, address: m.toEmail },
        subject: m.subject,
        text: m.text,
        html: m.html,
        messageId,
      });
      await markMailSent(db, { id: m.id, holder, messageId });
      sent++;
    } catch (err) {
      const reason = err instanceof Error ? err.message : String(err);
      console.error(`mail: ${m.template} to ${m.toEmail} not sent (attempt ${m.attempts}) — ${reason}`);
      await markMailRefused(db, { id: m.id, holder, attempts: m.attempts, error: reason });
      refused++;
    }
  }
  return { sent, refused, abandoned };
}

export interface MailWorker {
  stop(): Promise<void>;
}

/**
 * Polls the outbox every `intervalMs` in this process. Every app server runs one (started by
 * instrumentation.ts); their claims never overlap. A dead relay slows only this loop, never a request.
 */
export function startMailWorker(db: () => Knex, { intervalMs = 2_000 }: { intervalMs?: number } = {}): MailWorker {
  let stopped = false;
  let running: Promise<unknown> = Promise.resolve();
  let timer: NodeJS.Timeout | undefined;
  const tick = () => {
    if (stopped) return;
    running = deliverDueMail(db())
      .catch((err: unknown) => console.error("mail: outbox worker —", err instanceof Error ? err.message : String(err)))
      .finally(() => {
        if (!stopped) timer = setTimeout(tick, intervalMs).unref();
      });
  };
  timer = setTimeout(tick, 0).unref();
  return {
    async stop() {
      stopped = true;
      clearTimeout(timer);
      await running;
    },
  };
}
