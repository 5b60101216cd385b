import "server-only";
import type { Knex } from "knex";
import type { RowProblem, UploadInspection } from "@/lib/imports";
import { recordAudit } from "./audit-log";
import { conflict, notFound } from "@/lib/errors";
import type { PopulationUploadsRow } from "./tables";

export interface UploadRecord {
  id: number;
  engagementId: number;
  uploadedBy: number;
  fileName: string;
  sizeBytes: number;
  sha256: string;
  tempPath: string;
  inspection: UploadInspection;
  status: "inspected" | "loading" | "rejected" | "loaded" | "expired";
  problemCount: number;
  problems: RowProblem[];
  createdAt: string;
}

const parse = (v: unknown) => (typeof v === "string" ? JSON.parse(v) : v);

function toUpload(r: PopulationUploadsRow): UploadRecord {
  return {
    id: Number(r.id), engagementId: Number(r.engagement_id), uploadedBy: Number(r.uploaded_by), fileName: String(r.file_name),
    sizeBytes: Number(r.size_bytes), sha256: String(r.sha256), tempPath: String(r.temp_path), inspection: parse(r.inspection_json) as UploadInspection,
    status: r.status, problemCount: Number(r.problem_count), problems: (parse(r.problems_json) as RowProblem[] | null) ?? [],
    createdAt: r.created_at.toISOString(),
  };
}

/** A load still running counts as in progress for 30 minutes; after that it is treated as abandoned. */
const LOAD_STALE_MINUTES = 30;

export async function createUpload(db: Knex, u: { engagementId: number; actorId: number; fileName: string; sizeBytes: number; sha256: string; tempPath: string; inspection: UploadInspection }) {
  return db.transaction(async (trx) => {
    const [id] = await trx("population_uploads").insert({
      engagement_id: u.engagementId, uploaded_by: u.actorId, file_name: u.fileName, size_bytes: u.sizeBytes, sha256: u.sha256,
      temp_path: u.tempPath, inspection_json: JSON.stringify(u.inspection),
    });
    await recordAudit(trx, { actorUserId: u.actorId, engagementId: u.engagementId, entity: "population_upload", entityId: id, action: "receive", after: { fileName: u.fileName, sizeBytes: u.sizeBytes, sha256: u.sha256, kind: u.inspection.kind } });
    return id;
  });
}

export async function getUploadById(db: Knex, { engagementId, uploadId }: { engagementId: number; uploadId: number }): Promise<UploadRecord> {
  const row = await db("population_uploads").where({ id: uploadId, engagement_id: engagementId }).first();
  if (!row) throw notFound("No such upload");
  return toUpload(row);
}

export async function updateUploadInspection(db: Knex, { uploadId, inspection }: { uploadId: number; inspection: UploadInspection }) {
  await db("population_uploads").where({ id: uploadId }).update({ inspection_json: JSON.stringify(inspection) });
}

/** 409 while the same person has a load running: one load per person at a time. */
export async function assertNoLoadRunning(db: Knex, { userId }: { userId: number }) {
  const staleBefore = new Date(Date.now() - LOAD_STALE_MINUTES * 60_000);
  const running = await db("population_uploads").where({ uploaded_by: userId, status: "loading" }).andWhere("created_at", ">", staleBefore).first("file_name");
  if (running) throw conflict(`You already have a ledger loading (${running.file_name}). Wait for it to finish before uploading or loading another.`);
}

/** Refuses a second load while the same person has one running (409), then claims this upload. */
export async function claimUploadForLoading(db: Knex, { uploadId, userId }: { uploadId: number; userId: number }) {
  await assertNoLoadRunning(db, { userId });
  const claimed = await db("population_uploads").where({ id: uploadId }).whereIn("status", ["inspected"]).update({ status: "loading" });
  if (!claimed) throw conflict("This upload has already been loaded or rejected; upload the file again.");
}

export async function finishUpload(db: Knex, { uploadId, status, problems = [], problemCount = 0 }: { uploadId: number; status: "rejected" | "loaded"; problems?: RowProblem[]; problemCount?: number }) {
  await db("population_uploads").where({ id: uploadId }).update({ status, problem_count: problemCount, problems_json: JSON.stringify(problems) });
}
