import "server-only";
import type { Knex } from "knex";
import type { RowProblem, UploadInspection } from "@/lib/imports";
import { recordAudit } from "./audit-log";
import { conflict, isDatabaseUnavailable, notFound } from "@/lib/errors";
import type { PopulationUploadsRow } from "./tables";
import { parseJsonColumn } from "./json-column";
import { StoredInspectionSchema, StoredProblemsSchema } from "./upload-schemas";

export interface UploadRecord {
  id: number;
  engagementId: number;
  uploadedBy: number;
  fileName: string;
  sizeBytes: number;
  sha256: string;
  tempPath: string;
  inspection: UploadInspection;
  /** The file's bytes in object storage (any server can load it); null for uploads from before issue 17. */
  objectKey: string | null;
  status: "inspected" | "loading" | "rejected" | "loaded" | "expired" | "failed";
  /** Why the last load of this upload failed without an answer (its server stopped), for its owner. */
  failureMessage: string | null;
  problemCount: number;
  problems: RowProblem[];
  createdAt: string;
}

function toUpload(r: PopulationUploadsRow): UploadRecord {
  return {
    id: Number(r.id),
    engagementId: Number(r.engagement_id),
    uploadedBy: Number(r.uploaded_by),
    fileName: String(r.file_name),
    sizeBytes: Number(r.size_bytes),
    sha256: String(r.sha256),
    tempPath: String(r.temp_path),
    inspection: parseJsonColumn(StoredInspectionSchema, r.inspection_json, "population_uploads.inspection_json", r.id),
    objectKey: r.object_key ?? null,
    failureMessage: r.failure_message ?? null,
    status: r.status,
    problemCount: Number(r.problem_count),
    problems: parseJsonColumn(StoredProblemsSchema, r.problems_json, "population_uploads.problems_json", r.id) ?? [],
    createdAt: r.created_at.toISOString(),
  };
}

/**
 * A load holds a lease on its upload, renewed every LEASE_RENEW_MS by the server running it; one
 * whose lease ran out (its server stopped) is marked failed and may be loaded again. Times are the
 * database's, so app servers' clocks do not matter.
 */
export const LEASE_SECONDS = 45;
export const LEASE_RENEW_MS = 10_000;

export const deadLoadMessage = (fileName: string) =>
  `The server loading ${fileName} stopped before the load finished. Nothing was stored (the load is one transaction); load the file again.`;

const leaseUntil = (db: Knex) => db.raw(`NOW(3) + INTERVAL ${LEASE_SECONDS} SECOND`);

/**
 * Marks loads whose lease ran out (or that have none) as failed, with a message for their owner;
 * returns how many. A dead server's transaction was rolled back by the database when its
 * connection dropped, so its upload row is free to change.
 */
export async function failDeadLoads(db: Knex): Promise<number> {
  const dead = await db("population_uploads as u")
    .leftJoin("population_upload_leases as l", "l.upload_id", "u.id")
    .where("u.status", "loading")
    .andWhere((w) => {
      w.whereNull("l.upload_id").orWhere("l.expires_at", "<", db.fn.now(3));
    })
    .select("u.id", "u.file_name", "l.holder");
  let failed = 0;
  for (const u of dead as { id: number; file_name: string; holder: string | null }[]) {
    failed += await db.transaction(async (trx): Promise<number> => {
      const gone = await trx("population_upload_leases")
        .where({ upload_id: u.id })
        .andWhere("expires_at", "<", trx.fn.now(3))
        .del();
      if (!gone && u.holder !== null) return 0; // renewed meanwhile
      return trx("population_uploads")
        .where({ id: u.id, status: "loading" })
        .update({ status: "failed", failure_message: deadLoadMessage(u.file_name) });
    });
  }
  return failed;
}

/** Extends the lease while the load runs; false when this server no longer holds it. */
export async function renewLoadLease(
  db: Knex,
  { uploadId, holder }: { uploadId: number; holder: string },
): Promise<boolean> {
  return (
    (await db("population_upload_leases")
      .where({ upload_id: uploadId, holder })
      .update({ expires_at: leaseUntil(db) })) === 1
  );
}

export async function createUpload(
  db: Knex,
  u: {
    engagementId: number;
    actorId: number;
    fileName: string;
    sizeBytes: number;
    sha256: string;
    tempPath: string;
    objectKey: string;
    inspection: UploadInspection;
  },
) {
  return db.transaction(async (trx) => {
    const [id] = await trx("population_uploads").insert({
      engagement_id: u.engagementId,
      uploaded_by: u.actorId,
      file_name: u.fileName,
      size_bytes: u.sizeBytes,
      sha256: u.sha256,
      temp_path: u.tempPath,
      object_key: u.objectKey,
      inspection_json: JSON.stringify(u.inspection),
    });
    await recordAudit(trx, {
      actorUserId: u.actorId,
      engagementId: u.engagementId,
      entity: "population_upload",
      entityId: id,
      action: "receive",
      after: { fileName: u.fileName, sizeBytes: u.sizeBytes, sha256: u.sha256, kind: u.inspection.kind },
    });
    return id;
  });
}

export async function getUploadById(
  db: Knex,
  { engagementId, uploadId }: { engagementId: number; uploadId: number },
): Promise<UploadRecord> {
  const row = await db("population_uploads").where({ id: uploadId, engagement_id: engagementId }).first();
  if (!row) throw notFound("No such upload");
  return toUpload(row);
}

export async function updateUploadInspection(
  db: Knex,
  { uploadId, inspection }: { uploadId: number; inspection: UploadInspection },
) {
  await db("population_uploads")
    .where({ id: uploadId })
    .update({ inspection_json: JSON.stringify(inspection) });
}

/** 409 while the same person has a load running: one load per person at a time. */
export async function assertNoLoadRunning(db: Knex, { userId }: { userId: number }) {
  await failDeadLoads(db);
  const running = await db("population_uploads").where({ uploaded_by: userId, status: "loading" }).first("file_name");
  if (running)
    throw conflict(
      `You already have a ledger loading (${running.file_name}). Wait for it to finish before uploading or loading another. (If the server running it stopped, it is released within a minute.)`,
    );
}

/**
 * Refuses a second load while the same person has one running (409), then claims this upload for
 * this server with a lease. An upload whose earlier load failed with its server may be loaded again.
 */
export async function claimUploadForLoading(
  db: Knex,
  { uploadId, userId, holder }: { uploadId: number; userId: number; holder: string },
) {
  await assertNoLoadRunning(db, { userId });
  await db.transaction(async (trx) => {
    const claimed = await trx("population_uploads")
      .where({ id: uploadId })
      .whereIn("status", ["inspected", "failed"])
      .update({ status: "loading", failure_message: null });
    if (!claimed) throw conflict("This upload has already been loaded or rejected; upload the file again.");
    await trx.raw(
      "INSERT INTO population_upload_leases (upload_id, holder, expires_at) VALUES (?, ?, NOW(3) + INTERVAL ? SECOND) ON DUPLICATE KEY UPDATE holder = VALUES(holder), expires_at = VALUES(expires_at)",
      [uploadId, holder, LEASE_SECONDS],
    );
  });
}

/**
 * Inside the load's transaction, just before it commits: the upload must still be this server's
 * (its lease not taken over), and becomes loaded in the same commit as the population. The row
 * lock makes a concurrent claim wait for the outcome.
 */
export async function completeLeasedLoad(
  trx: Knex.Transaction,
  { uploadId, holder }: { uploadId: number; holder: string },
) {
  const lease = await trx("population_upload_leases").where({ upload_id: uploadId }).forUpdate().first("holder");
  const row = await trx("population_uploads").where({ id: uploadId }).first("status");
  if (row?.status !== "loading" || lease?.holder !== holder) {
    throw conflict(
      "This load lost its claim on the upload (the server was too slow to renew it); nothing was stored. Load the file again.",
    );
  }
  await trx("population_upload_leases").where({ upload_id: uploadId }).del();
  await trx("population_uploads")
    .where({ id: uploadId })
    .update({ status: "loaded", problem_count: 0, problems_json: JSON.stringify([]) });
}

/** Records a load's refusal; only while this server still holds the upload (a taken-over load is left to its new holder). */
export async function finishUpload(
  db: Knex,
  {
    uploadId,
    holder,
    status,
    problems = [],
    problemCount = 0,
  }: { uploadId: number; holder: string; status: "rejected"; problems?: RowProblem[]; problemCount?: number },
) {
  // The failed load's own transaction may still be rolling back (knex stops waiting for a ROLLBACK
  // after 5 s; undoing a million rows takes longer, most on a Galera node) and holds the upload
  // row through the population's foreign key: wait for it, a lock-wait timeout at a time.
  // A load cut by the database going away (a Galera writer killed) reaches here while the front door
  // fails over: wait for the database to answer again, so the owner may load at once rather than
  // after the lease runs out.
  const outageEnds = Date.now() + FINISH_OUTAGE_MS;
  for (let attempt = 1; ; attempt++) {
    try {
      await db.transaction(async (trx) => {
        if (!(await trx("population_upload_leases").where({ upload_id: uploadId, holder }).del())) return;
        await trx("population_uploads")
          .where({ id: uploadId, status: "loading" })
          .update({ status, problem_count: problemCount, problems_json: JSON.stringify(problems) });
      });
      return;
    } catch (err) {
      if (isDatabaseUnavailable(err) && Date.now() < outageEnds) {
        await new Promise((r) => setTimeout(r, 1_000));
        continue;
      }
      if ((err as { code?: unknown }).code !== "ER_LOCK_WAIT_TIMEOUT" || attempt >= FINISH_ATTEMPTS) throw err;
      console.warn(
        `[sondage] upload ${uploadId}: the failed load is still rolling back; waiting again (attempt ${attempt + 1} of ${FINISH_ATTEMPTS})`,
      );
    }
  }
}

/** How long a failed load's upload waits for an unreachable database before the lease's expiry is left to release it. */
const FINISH_OUTAGE_MS = 30_000;

/** Lock waits (innodb_lock_wait_timeout, 50 s by default) a failed load's upload waits for its rollback. */
const FINISH_ATTEMPTS = 6;
