import "server-only";
import { renderEmailTemplate, type EmailTemplateData, type EmailTemplateName } from "@/templates/email";
import { getMailer } from "./transport";

export interface Recipient { name: string; email: string }

export type MailResult = { sent: true; to: string; messageId: string } | { sent: false; to: string; reason: string };

/**
 * Renders a template and sends it to one person. Never throws: a send that fails (relay down, bad
 * settings, bad template data) is logged and reported in the result, so it cannot undo or fail the
 * write that prompted it. Call it after the write's transaction has committed.
 */
export async function sendMail<K extends EmailTemplateName>({ to, template, data }: { to: Recipient; template: K; data: EmailTemplateData[K] }): Promise<MailResult> {
  try {
    const { transporter, from } = getMailer();
    const { subject, text, html } = renderEmailTemplate(template, data);
    const info = await transporter.sendMail({ from, to: { name: to.name, address: to.email }, subject, text, html });
    return { sent: true, to: to.email, messageId: String(info.messageId) };
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    console.error(`mail: ${template} to ${to.email} not sent — ${reason}`);
    return { sent: false, to: to.email, reason };
  }
}
