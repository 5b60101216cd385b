import "server-only";
import type { Knex } from "knex";
import { enqueueMail } from "@/lib/data/mail-outbox";
import { getFirmIdByUserEmail } from "@/lib/data/users";
import { renderEmailTemplate, type EmailTemplateData, type EmailTemplateName } from "@/templates/email";

export interface Recipient {
  name: string;
  email: string;
}

/** `sent` means accepted into the outbox; the worker (lib/mail/outbox-worker.ts) delivers it. */
export type MailResult = { sent: true; to: string; outboxId: number } | { sent: false; to: string; reason: string };

/**
 * Renders a template and queues it for one person in the mail outbox. Give it the transaction of
 * the change that prompts it and the message commits with the change (or not at all); the send
 * itself happens in the outbox worker, so a slow or dead relay never holds up a request. Never
 * throws: a message that cannot be queued (bad template data) is logged and reported.
 * The outbox row carries the recipient's firm (when they have an account) for the admin's view.
 */
export async function sendMail<K extends EmailTemplateName>(
  db: Knex,
  { to, template, data }: { to: Recipient; template: K; data: EmailTemplateData[K] },
): Promise<MailResult> {
  try {
    const { subject, text, html } = renderEmailTemplate(template, data);
    const outboxId = await enqueueMail(db, {
      firmId: await getFirmIdByUserEmail(db, { email: to.email }),
      template,
      toName: to.name,
      toEmail: to.email,
      subject,
      text,
      html,
    });
    return { sent: true, to: to.email, outboxId };
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    console.error(`mail: ${template} to ${to.email} not queued — ${reason}`);
    return { sent: false, to: to.email, reason };
  }
}
