import "server-only";
import { createHash } from "node:crypto";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import type { SampleRecord } from "@/lib/data/samples";
import { AppError, conflict } from "@/lib/errors";
import { putObjectBytes } from "@/lib/storage/objects";
import { lockedError } from "@/lib/samples/guard";
import { CLOSED_BY_LOCK, closeRequestListsOfSample } from "@/lib/requests/lists";
import type { EngagementRole } from "@/lib/auth/roles";
import { freezeSampleContribution, thawSampleContribution } from "@/lib/data/misstatements";
import { loadSampleContribution } from "@/lib/misstatements/from-sample";
import { clearSampleLockById, getSampleReviewColumnsById, setSampleLockById } from "@/lib/data/sample-review";

export type RenderFinalWorkpaper = (lockInfo: {
  lockedById: number;
  role: EngagementRole;
  lockedAt: Date;
  reference: string;
}) => Promise<Buffer>;

export const workpaperReferenceFor = (sample: SampleRecord) =>
  `WP-${sample.engagementId}-S${String(sample.id).padStart(3, "0")}`;

/**
 * Locks a reviewer-signed sample: the final workpaper is rendered ONCE, stored in object storage
 * with its SHA-256, and from then on every write to the sample answers 409 and downloads serve
 * exactly those bytes (AS 1215 / ISA 230: documentation assembled and not changed afterwards).
 */
export async function lockSample(
  db: Knex,
  {
    sample,
    actorId,
    role,
    render,
    inTransaction,
  }: {
    sample: SampleRecord;
    actorId: number;
    role: EngagementRole;
    render: RenderFinalWorkpaper;
    /** Runs before the commit with the lists the lock closed (the notices are queued there, so they commit with the lock). */
    inTransaction?: (trx: Knex.Transaction, closedListIds: number[]) => Promise<unknown>;
  },
) {
  const row = await getSampleReviewColumnsById(db, { sampleId: sample.id });
  if (row.locked_at) throw lockedError();
  if (!row.reviewer_signed_at)
    throw conflict("A manager or partner must sign off as reviewer before the sample is locked.");
  const lockedAt = new Date();
  const reference = workpaperReferenceFor(sample);
  const pdf = await render({ lockedById: actorId, role, lockedAt, reference });
  const sha256 = createHash("sha256").update(pdf).digest("hex");
  const key = `engagements/${sample.engagementId}/samples/${sample.id}/workpaper-${lockedAt.getTime()}-${sha256.slice(0, 12)}.pdf`;
  await putObjectBytes({ key, bytes: pdf, contentType: "application/pdf" });
  // What the sample carries to the summary of misstatements, frozen as it stands at the lock.
  const contribution = await loadSampleContribution(db, {
    engagementId: sample.engagementId,
    sampleId: sample.id,
    lockedAt: lockedAt.toISOString(),
  });
  const closedListIds = await db.transaction(async (trx) => {
    const current = await getSampleReviewColumnsById(trx, { sampleId: sample.id, lock: true });
    if (current.locked_at) throw lockedError();
    if (!current.reviewer_signed_at)
      throw conflict("The reviewer sign-off was cleared while the workpaper was being rendered; sign off again.");
    await setSampleLockById(trx, {
      sampleId: sample.id,
      lockedBy: actorId,
      lockedAt,
      objectKey: key,
      sha256,
      sizeBytes: pdf.length,
      reference,
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample",
      entityId: sample.id,
      action: "lock",
      after: { role, workpaperSha256: sha256, bytes: pdf.length, reference },
    }); // The workpaper is final, so the client is asked for nothing more on this sample.
    await freezeSampleContribution(trx, { engagementId: sample.engagementId, contribution });
    const closed = await closeRequestListsOfSample(trx, {
      sampleId: sample.id,
      engagementId: sample.engagementId,
      actorId,
      reason: CLOSED_BY_LOCK,
    });
    await inTransaction?.(trx, closed);
    return closed;
  });
  return { sha256, bytes: pdf.length, reference, closedListIds };
}

/** Unlocks a locked sample: partners only, with a reason; the stored workpaper stays on record in the log. */
export async function unlockSample(
  db: Knex,
  { sample, actorId, role, reason }: { sample: SampleRecord; actorId: number; role: EngagementRole; reason: string },
) {
  if (role !== "partner") throw new AppError(403, "forbidden", "Only a partner can unlock a locked sample.");
  await db.transaction(async (trx) => {
    const row = await getSampleReviewColumnsById(trx, { sampleId: sample.id, lock: true });
    if (!row.locked_at) throw conflict("The sample is not locked.");
    await clearSampleLockById(trx, { sampleId: sample.id });
    await thawSampleContribution(trx, { sampleId: sample.id });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample",
      entityId: sample.id,
      action: "unlock",
      before: {
        lockedAt: row.locked_at,
        workpaperSha256: row.workpaper_sha256,
        workpaperObjectKey: row.workpaper_object_key,
      },
      after: { reason, reviewerSignOff: "cleared" },
    });
  });
}
