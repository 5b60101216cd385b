import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { AppError, notFound } from "@/lib/errors";

export const LOCKED_MESSAGE = "This sample is locked: its workpaper is final. A partner can unlock it, with a reason, if a change is needed.";

export const lockedError = () => new AppError(409, "locked", LOCKED_MESSAGE);

async function lockRow(trx: Knex.Transaction, sampleId: number) {
  const row = await trx("samples").where({ id: sampleId }).forUpdate().first("id", "engagement_id", "locked_at", "preparer_signed_at", "reviewer_signed_at");
  if (!row) throw notFound("No such sample");
  if (row.locked_at) throw lockedError();
  return row;
}

/** For writes that do not touch the work itself (review notes): refuses when locked. */
export async function assertSampleUnlocked(trx: Knex.Transaction, sampleId: number): Promise<void> {
  await lockRow(trx, sampleId);
}

/**
 * Every change to a sample's plan, selection, results or evidence goes through here inside its
 * transaction: 409 when the sample is locked, and any sign-off is cleared (and recorded) because
 * what was signed is no longer what is there. Returns whether sign-offs were cleared.
 */
export async function beginSampleWrite(trx: Knex.Transaction, { sampleId, actorId, what }: { sampleId: number; actorId: number; what: string }): Promise<boolean> {
  const row = await lockRow(trx, sampleId);
  if (!row.preparer_signed_at && !row.reviewer_signed_at) return false;
  await trx("samples").where({ id: sampleId }).update({
    preparer_signed_by: null, preparer_signed_role: null, preparer_signed_at: null,
    reviewer_signed_by: null, reviewer_signed_role: null, reviewer_signed_at: null,
  });
  await recordAudit(trx, {
    actorUserId: actorId, engagementId: row.engagement_id, sampleId, entity: "sample", entityId: sampleId, action: "sign-offs-cleared",
    before: { preparerSignedAt: row.preparer_signed_at, reviewerSignedAt: row.reviewer_signed_at }, after: { reason: `changed after sign-off: ${what}` },
  });
  return true;
}
