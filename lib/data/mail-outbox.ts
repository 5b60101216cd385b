import "server-only";
import type { Knex } from "knex";

export interface OutboxMessage {
  id: number;
  firmId: number | null;
  template: string;
  toName: string;
  toEmail: string;
  subject: string;
  text: string;
  html: string;
  attempts: number;
}

export interface UndeliveredMessage {
  id: number;
  template: string;
  toEmail: string;
  subject: string;
  status: "pending" | "failed" | "unknown";
  attempts: number;
  lastError: string | null;
  nextAttemptAt: string | null;
  createdAt: string;
}

/** Attempts before a message is given up as failed (with the backoff below, about 4 hours). */
export const MAX_ATTEMPTS = 8;
/** How long a worker may hold a message it is sending before it counts as dead. */
export const CLAIM_SECONDS = 120;

/** Wait before attempt n+1 after n failures: 30 s doubling, at most an hour (common practice: exponential backoff with a cap). */
export const backoffSeconds = (failures: number) => Math.min(3600, 30 * 2 ** Math.max(0, failures - 1));

/** Queues a message; give it the transaction of the change that causes it, so both commit or neither does. */
export async function enqueueMail(
  db: Knex,
  m: {
    firmId: number | null;
    template: string;
    toName: string;
    toEmail: string;
    subject: string;
    text: string;
    html: string;
  },
): Promise<number> {
  const [id] = await db("mail_outbox").insert({
    firm_id: m.firmId,
    template: m.template,
    to_name: m.toName,
    to_email: m.toEmail,
    subject: m.subject,
    text_body: m.text,
    html_body: m.html,
  });
  return id;
}

/**
 * Claims up to `limit` due messages for this worker. SKIP LOCKED lets several app servers' workers
 * claim at once without waiting on (or taking) each other's rows.
 */
export async function claimDueMail(
  db: Knex,
  { holder, limit }: { holder: string; limit: number },
): Promise<OutboxMessage[]> {
  return db.transaction(async (trx) => {
    const [rows] = await trx.raw(
      "SELECT id FROM mail_outbox WHERE status = 'pending' AND next_attempt_at <= NOW(3) ORDER BY next_attempt_at, id LIMIT ? FOR UPDATE SKIP LOCKED",
      [limit],
    );
    const ids = (rows as { id: number }[]).map((r) => r.id);
    if (!ids.length) return [];
    await trx("mail_outbox")
      .whereIn("id", ids)
      .update({
        status: "sending",
        claimed_by: holder,
        claimed_until: trx.raw(`NOW(3) + INTERVAL ${CLAIM_SECONDS} SECOND`),
        attempts: trx.raw("attempts + 1"),
      });
    const claimed = await trx("mail_outbox").whereIn("id", ids).orderBy("id").select("*");
    return claimed.map((r) => ({
      id: Number(r.id),
      firmId: r.firm_id === null ? null : Number(r.firm_id),
      template: r.template,
      toName: r.to_name,
      toEmail: r.to_email,
      subject: r.subject,
      text: r.text_body,
      html: r.html_body,
      attempts: Number(r.attempts),
    }));
  });
}

export async function markMailSent(
  db: Knex,
  { id, holder, messageId }: { id: number; holder: string; messageId: string },
) {
  await db("mail_outbox")
    .where({ id, status: "sending", claimed_by: holder })
    .update({
      status: "sent",
      sent_at: db.fn.now(3),
      message_id: messageId,
      claimed_by: null,
      claimed_until: null,
      last_error: null,
    });
}

/** The relay refused or could not be reached: try again after the backoff, or give up after the last attempt. */
export async function markMailRefused(
  db: Knex,
  { id, holder, attempts, error }: { id: number; holder: string; attempts: number; error: string },
) {
  const giveUp = attempts >= MAX_ATTEMPTS;
  await db("mail_outbox")
    .where({ id, status: "sending", claimed_by: holder })
    .update({
      status: giveUp ? "failed" : "pending",
      last_error: error.slice(0, 2000),
      claimed_by: null,
      claimed_until: null,
      next_attempt_at: db.raw(`NOW(3) + INTERVAL ${giveUp ? 0 : backoffSeconds(attempts)} SECOND`),
    });
}

/**
 * A message still "sending" after its claim ran out belongs to a worker that died mid-send: the
 * relay may or may not have taken it, so it is never sent again by itself (a message is never sent
 * twice); it is marked unknown for the firm admin to see.
 */
export async function markAbandonedSends(db: Knex): Promise<number> {
  return db("mail_outbox").where({ status: "sending" }).andWhere("claimed_until", "<", db.fn.now(3)).update({
    status: "unknown",
    last_error:
      "The server sending this message stopped mid-send; it may or may not have been delivered, so it was not sent again.",
    claimed_by: null,
    claimed_until: null,
  });
}

/** Messages of the firm not (yet, or not known to be) delivered, newest first. */
export async function listUndeliveredMailByFirmId(
  db: Knex,
  { firmId, limit = 200 }: { firmId: number; limit?: number },
): Promise<UndeliveredMessage[]> {
  const rows = await db("mail_outbox")
    .where({ firm_id: firmId })
    .andWhere((w) => {
      w.whereIn("status", ["failed", "unknown"]).orWhere((p) => {
        p.where("status", "pending").andWhere("attempts", ">", 0);
      });
    })
    .orderBy("id", "desc")
    .limit(limit)
    .select(
      "id",
      "template",
      "to_email",
      "subject",
      "status",
      "attempts",
      "last_error",
      "next_attempt_at",
      "created_at",
    );
  return rows.map((r: Record<string, unknown>) => ({
    id: Number(r.id),
    template: String(r.template),
    toEmail: String(r.to_email),
    subject: String(r.subject),
    status: r.status as UndeliveredMessage["status"],
    attempts: Number(r.attempts),
    lastError: (r.last_error as string | null) ?? null,
    nextAttemptAt:
      r.status === "pending" && r.next_attempt_at ? new Date(r.next_attempt_at as string).toISOString() : null,
    createdAt: new Date(r.created_at as string).toISOString(),
  }));
}
