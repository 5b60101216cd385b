import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { AppError, notFound } from "@/lib/errors";
import { mustExist } from "@/lib/data/must-exist";
import { clearSampleConclusionById, clearSampleSignOffsById, getSampleWriteStateById } from "@/lib/data/samples";

export const LOCKED_MESSAGE =
  "This sample is locked: its workpaper is final. A partner can unlock it, with a reason, if a change is needed.";

export const lockedError = () => new AppError(409, "locked", LOCKED_MESSAGE);

async function lockRow(trx: Knex.Transaction, sampleId: number) {
  const row = await getSampleWriteStateById(trx, { sampleId, lock: "update" });
  if (!row) throw notFound("No such sample");
  if (row.lockedAt) throw lockedError();
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
  const concluded = Boolean(row.auditorConclusionAt);
  if (concluded) {
    await clearSampleConclusionById(trx, { sampleId });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: row.engagementId,
      sampleId,
      entity: "sample",
      entityId: sampleId,
      action: "auditor-conclusion-cleared",
      before: {
        conclusion: row.auditorConclusion,
        responses: row.auditorResponses,
        at: row.auditorConclusionAt,
      },
      after: { reason: `changed after the conclusion: ${what}` },
    });
  }
  if (!row.preparerSignedAt && !row.reviewerSignedAt) return concluded;
  await clearSampleSignOffsById(trx, { sampleId });
  await recordAudit(trx, {
    actorUserId: actorId,
    engagementId: row.engagementId,
    sampleId,
    entity: "sample",
    entityId: sampleId,
    action: "sign-offs-cleared",
    before: { preparerSignedAt: row.preparerSignedAt, reviewerSignedAt: row.reviewerSignedAt },
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
  const peek = await getSampleWriteStateById(trx, { sampleId: a.sampleId });
  if (!peek) throw notFound("No such sample");
  if (peek.lockedAt) throw lockedError();
  if (peek.preparerSignedAt || peek.reviewerSignedAt || peek.auditorConclusionAt) return beginSampleWrite(trx, a);
  const row = mustExist(
    await getSampleWriteStateById(trx, { sampleId: a.sampleId, lock: "share" }),
    `sample ${a.sampleId}`,
  );
  if (row.lockedAt) throw lockedError();
  // Signed or concluded between the peek and the shared lock (rare): upgrade; InnoDB resolves a clash of two such upgrades as a deadlock (answered 409).
  if (row.preparerSignedAt || row.reviewerSignedAt || row.auditorConclusionAt) return beginSampleWrite(trx, a);
  return false;
}
