import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { z } from "zod";

// Locally SMTP_HOST/SMTP_PORT point at the loopback catcher (lib/fakes/smtp-fake.ts); in production at
// the firm's SMTP relay, with SMTP_SECURE / SMTP_USER / SMTP_PASSWORD as that relay needs.
const MailEnv = z.object({
  SMTP_HOST: z.string().trim().min(1, "SMTP_HOST is required"),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535),
  SMTP_SECURE: z
    .enum(["true", "false"])
    .default("false")
    .transform((v) => v === "true"),
  SMTP_USER: z.string().min(1).optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z
    .string()
    .trim()
    .regex(
      /^(?:[^<>]*<[^<>\s@]+@[^<>\s@]+>|[^<>\s@]+@[^<>\s@]+)$/,
      "MAIL_FROM must be an address such as Sondage <no-reply@example.com>",
    ),
});

export interface Mailer {
  transporter: Transporter;
  from: string;
}

const globalForMail = globalThis as unknown as { sondageMailer?: Mailer };

// Bounded waits so an unreachable relay delays a request by seconds, not nodemailer's default minutes.
const TIMEOUTS = { connectionTimeout: 5_000, greetingTimeout: 5_000, socketTimeout: 15_000 };

/** The nodemailer transport and sender, built once from the environment; throws naming a bad setting. */
export function getMailer(): Mailer {
  if (globalForMail.sondageMailer) return globalForMail.sondageMailer;
  const parsed = MailEnv.safeParse(process.env);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ");
    throw new Error(`mail settings are invalid — ${problems}`);
  }
  const env = parsed.data;
  const transporter = nodemailer.createTransport({
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE,
    auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? "" } : undefined,
    ...TIMEOUTS,
  });
  globalForMail.sondageMailer = { transporter, from: env.MAIL_FROM };
  return globalForMail.sondageMailer;
}

/** Closes the transport; the next send builds it again from the environment (shutdown, or settings changed). */
export function closeMailer(): void {
  globalForMail.sondageMailer?.transporter.close();
  globalForMail.sondageMailer = undefined;
}
