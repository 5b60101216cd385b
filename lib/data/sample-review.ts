import "server-only";
import type { Knex } from "knex";
import type { EngagementRole } from "@/lib/auth/roles";
import type { SamplesRow } from "./tables";
import { mustExist } from "./must-exist";

// The review columns of `samples`: the two sign-offs, the lock and the final workpaper stored at lock.

const REVIEW_COLUMNS = [
  "preparer_signed_by",
  "preparer_signed_role",
  "preparer_signed_at",
  "reviewer_signed_by",
  "reviewer_signed_role",
  "reviewer_signed_at",
  "locked_by",
  "locked_at",
  "workpaper_object_key",
  "workpaper_sha256",
  "workpaper_size_bytes",
  "workpaper_reference",
  "auditor_conclusion_at",
] as const;

export type SampleReviewColumns = Pick<SamplesRow, (typeof REVIEW_COLUMNS)[number]>;

/** The sample's review columns (under a row lock to the end of the transaction when `lock`); a missing sample is a bug. */
export async function getSampleReviewColumnsById(
  db: Knex | Knex.Transaction,
  { sampleId, lock = false }: { sampleId: number; lock?: boolean },
): Promise<SampleReviewColumns> {
  const q = db("samples").where({ id: sampleId });
  if (lock) q.forUpdate();
  return mustExist(await q.first(...REVIEW_COLUMNS), `sample ${sampleId}`);
}

export interface SampleReviewNames {
  preparerName: string | null;
  reviewerName: string | null;
  lockedByName: string | null;
}

/** The review columns with the names of who signed and who locked. */
export async function getSampleReviewById(
  db: Knex | Knex.Transaction,
  { sampleId }: { sampleId: number },
): Promise<SampleReviewColumns & SampleReviewNames> {
  const row = mustExist(
    await db("samples as s")
      .leftJoin("users as p", "p.id", "s.preparer_signed_by")
      .leftJoin("users as v", "v.id", "s.reviewer_signed_by")
      .leftJoin("users as l", "l.id", "s.locked_by")
      .where("s.id", sampleId)
      .first(
        ...REVIEW_COLUMNS.map((c) => `s.${c}` as const),
        "p.name as p_name",
        "v.name as v_name",
        "l.name as l_name",
      ),
    `sample ${sampleId}`,
  );
  const { p_name, v_name, l_name, ...columns } = row;
  return { ...columns, preparerName: p_name ?? null, reviewerName: v_name ?? null, lockedByName: l_name ?? null };
}

export async function setPreparerSignOffBySampleId(
  trx: Knex.Transaction,
  { sampleId, actorId, role }: { sampleId: number; actorId: number; role: EngagementRole },
) {
  await trx("samples")
    .where({ id: sampleId })
    .update({ preparer_signed_by: actorId, preparer_signed_role: role, preparer_signed_at: trx.fn.now(3) });
}

export async function setReviewerSignOffBySampleId(
  trx: Knex.Transaction,
  { sampleId, actorId, role }: { sampleId: number; actorId: number; role: EngagementRole },
) {
  await trx("samples")
    .where({ id: sampleId })
    .update({ reviewer_signed_by: actorId, reviewer_signed_role: role, reviewer_signed_at: trx.fn.now(3) });
}

/** Marks the sample locked, with the final workpaper stored at the lock. */
export async function setSampleLockById(
  trx: Knex.Transaction,
  a: {
    sampleId: number;
    lockedBy: number;
    lockedAt: Date;
    objectKey: string;
    sha256: string;
    sizeBytes: number;
    reference: string;
  },
) {
  await trx("samples").where({ id: a.sampleId }).update({
    locked_by: a.lockedBy,
    locked_at: a.lockedAt,
    workpaper_object_key: a.objectKey,
    workpaper_sha256: a.sha256,
    workpaper_size_bytes: a.sizeBytes,
    workpaper_reference: a.reference,
  });
}

/** Unlocks the sample: the lock, the stored workpaper's key and the reviewer sign-off go. */
export async function clearSampleLockById(trx: Knex.Transaction, { sampleId }: { sampleId: number }) {
  await trx("samples").where({ id: sampleId }).update({
    locked_by: null,
    locked_at: null,
    workpaper_object_key: null,
    workpaper_sha256: null,
    workpaper_size_bytes: null,
    reviewer_signed_by: null,
    reviewer_signed_role: null,
    reviewer_signed_at: null,
  });
}
