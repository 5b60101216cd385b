import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { AppError, notFound } from "@/lib/errors";
import { CLEARED_CONCLUSION } from "@/lib/data/auditor-conclusions";
import { mustExist } from "@/lib/data/must-exist";

export const LOCKED_MESSAGE =
  "This sample is locked: its workpaper is final. A partner can unlock it, with a reason, if a change is needed.";

export const lockedError = () => new AppError(409, "locked", LOCKED_MESSAGE);

async function lockRow(trx: Knex.Transaction, sampleId: number) {
  const row = await trx("samples")
    .where({ id: sampleId })
    .forUpdate()
    .first(
      "id",
      "engagement_id",
      "locked_at",
      "preparer_signed_at",
      "reviewer_signed_at",
      "auditor_conclusion",
      "auditor_responses_json",
      "auditor_conclusion_at",
    );
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
 * transaction: 409 when the sample is locked, and any sign-off and the auditor's conclusion and
 * response are cleared (and recorded, with what they said) because what was signed and concluded
 * on is no longer what is there. Returns whether anything was cleared.
 */
export async function beginSampleWrite(
  trx: Knex.Transaction,
  { sampleId, actorId, what }: { sampleId: number; actorId: number; what: string },
): Promise<boolean> {
  const row = await lockRow(trx, sampleId);
  const concluded = Boolean(row.auditor_conclusion_at);
  if (concluded) {
    await trx("samples").where({ id: sampleId }).update(CLEARED_CONCLUSION);
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: row.engagement_id,
      sampleId,
      entity: "sample",
      entityId: sampleId,
      action: "auditor-conclusion-cleared",
      before: {
        conclusion: row.auditor_conclusion,
        responses: row.auditor_responses_json,
        at: row.auditor_conclusion_at,
      },
      after: { reason: `changed after the conclusion: ${what}` },
    });
  }
  if (!row.preparer_signed_at && !row.reviewer_signed_at) return concluded;
  await trx("samples").where({ id: sampleId }).update({
    preparer_signed_by: null,
    preparer_signed_role: null,
    preparer_signed_at: null,
    reviewer_signed_by: null,
    reviewer_signed_role: null,
    reviewer_signed_at: null,
  });
  await recordAudit(trx, {
    actorUserId: actorId,
    engagementId: row.engagement_id,
    sampleId,
    entity: "sample",
    entityId: sampleId,
    action: "sign-offs-cleared",
    before: { preparerSignedAt: row.preparer_signed_at, reviewerSignedAt: row.reviewer_signed_at },
    after: { reason: `changed after sign-off: ${what}` },
  });
  return true;
}

/**
 * beginSampleWrite for a result save, the one write many people make at once on one sample: while
 * nothing is signed off it takes a SHARED lock on the sample row, so saves on different items run
 * side by side, while lock, unlock and sign-off (which take the row exclusively) still wait for
 * every save in flight and are seen by every save after them. Signed off: the exclusive path,
 * which clears the sign-offs.
 */
export async function beginResultWrite(
  trx: Knex.Transaction,
  a: { sampleId: number; actorId: number; what: string },
): Promise<boolean> {
  const peek = await trx("samples")
    .where({ id: a.sampleId })
    .first("locked_at", "preparer_signed_at", "reviewer_signed_at", "auditor_conclusion_at");
  if (!peek) throw notFound("No such sample");
  if (peek.locked_at) throw lockedError();
  if (peek.preparer_signed_at || peek.reviewer_signed_at || peek.auditor_conclusion_at) return beginSampleWrite(trx, a);
  const row = mustExist(
    await trx("samples")
      .where({ id: a.sampleId })
      .forShare()
      .first("locked_at", "preparer_signed_at", "reviewer_signed_at", "auditor_conclusion_at"),
    `sample ${a.sampleId}`,
  );
  if (row.locked_at) throw lockedError();
  // Signed or concluded between the peek and the shared lock (rare): upgrade; InnoDB resolves a clash of two such upgrades as a deadlock (answered 409).
  if (row.preparer_signed_at || row.reviewer_signed_at || row.auditor_conclusion_at) return beginSampleWrite(trx, a);
  return false;
}
