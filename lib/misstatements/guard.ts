import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { AppError } from "@/lib/errors";
import {
  lockSummaryByEngagementId,
  SUMMARY_SIGN_OFFS_CLEARED,
  updateSummaryByEngagementId,
} from "@/lib/data/misstatement-summaries";

export const SUMMARY_LOCKED_MESSAGE =
  "The summary of misstatements is locked: its workpaper is final. A partner can unlock it, with a reason, if a change is needed.";

/** The summary's row, created on first use, held FOR UPDATE for the rest of the transaction. */
export async function lockSummaryRow(trx: Knex.Transaction, engagementId: number) {
  return lockSummaryByEngagementId(trx, { engagementId });
}

/**
 * Every change to the summary (entries, corrections, settings, evidence) goes through here inside its
 * transaction: 409 when locked, and any sign-off is cleared and recorded, because what was signed is
 * no longer what is there.
 */
export async function beginSummaryWrite(
  trx: Knex.Transaction,
  { engagementId, actorId, what }: { engagementId: number; actorId: number; what: string },
): Promise<boolean> {
  const row = await lockSummaryRow(trx, engagementId);
  if (row.locked_at) throw new AppError(409, "locked", SUMMARY_LOCKED_MESSAGE);
  if (!row.preparer_signed_at && !row.reviewer_signed_at) return false;
  await updateSummaryByEngagementId(trx, { engagementId, patch: SUMMARY_SIGN_OFFS_CLEARED });
  await recordAudit(trx, {
    actorUserId: actorId,
    engagementId,
    entity: "misstatement_summary",
    entityId: engagementId,
    action: "sign-offs-cleared",
    before: { preparerSignedAt: row.preparer_signed_at, reviewerSignedAt: row.reviewer_signed_at },
    after: { reason: `changed after sign-off: ${what}` },
  });
  return true;
}

/** For review notes: refuses when locked, clears nothing. */
export async function assertSummaryUnlocked(trx: Knex.Transaction, engagementId: number) {
  const row = await lockSummaryRow(trx, engagementId);
  if (row.locked_at) throw new AppError(409, "locked", SUMMARY_LOCKED_MESSAGE);
  return row;
}
