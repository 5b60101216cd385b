import "server-only";
import { createHash, randomUUID } from "node:crypto";
import type { Knex } from "knex";
import type { EngagementRole } from "@/lib/auth/roles";
import { recordAudit } from "@/lib/data/audit-log";
import { getCurrentDraw } from "@/lib/data/samples";
import { getItemById } from "@/lib/data/sample-items";
import { AppError, notFound } from "@/lib/errors";
import { putObjectBytes } from "@/lib/storage/objects";
import { beginSampleWrite } from "@/lib/samples/guard";
import { sniffEvidence } from "@/lib/files/sniff-evidence";

/** Largest evidence file accepted. */
export const MAX_EVIDENCE_BYTES = 25 * 1024 * 1024;

export interface EvidenceRecord {
  id: number;
  sampleItemId: number;
  fileName: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  objectKey: string;
  uploadedById: number;
  uploadedByName: string;
  uploadedAt: string;
  deletedAt: string | null;
  deletedByName: string | null;
}

const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null);

function toEvidence(r: Record<string, unknown>): EvidenceRecord {
  return {
    id: Number(r.id),
    sampleItemId: Number(r.sample_item_id),
    fileName: String(r.file_name),
    contentType: String(r.content_type),
    sizeBytes: Number(r.size_bytes),
    sha256: String(r.sha256),
    objectKey: String(r.object_key),
    uploadedById: Number(r.uploaded_by),
    uploadedByName: String(r.uploaded_by_name ?? ""),
    uploadedAt: iso(r.uploaded_at)!,
    deletedAt: iso(r.deleted_at),
    deletedByName: (r.deleted_by_name as string | null) ?? null,
  };
}

const evidenceQuery = (db: Knex) =>
  db("item_evidence as e")
    .join("users as u", "u.id", "e.uploaded_by")
    .leftJoin("users as d", "d.id", "e.deleted_by")
    .select("e.*", "u.name as uploaded_by_name", "d.name as deleted_by_name");

/** The item, when it belongs to the sample's current draw (404 otherwise). */
export async function getItemOfSample(db: Knex, { sampleId, itemId }: { sampleId: number; itemId: number }) {
  const draw = await getCurrentDraw(db, { sampleId });
  if (!draw) throw notFound("No such item in this sample");
  return getItemById(db, { drawId: draw.id, itemId });
}

export async function listEvidenceByItemId(
  db: Knex,
  { itemId, includeDeleted = false }: { itemId: number; includeDeleted?: boolean },
) {
  const q = evidenceQuery(db).where("e.sample_item_id", itemId).orderBy("e.id");
  if (!includeDeleted) q.whereNull("e.deleted_at");
  return (await q).map(toEvidence);
}

export async function getEvidenceById(db: Knex, { itemId, evidenceId }: { itemId: number; evidenceId: number }) {
  const row = await evidenceQuery(db)
    .where({ "e.id": evidenceId, "e.sample_item_id": itemId })
    .whereNull("e.deleted_at")
    .first();
  if (!row) throw notFound("No such evidence file");
  return toEvidence(row);
}

const auditView = (e: EvidenceRecord) => ({
  sampleItemId: e.sampleItemId,
  fileName: e.fileName,
  contentType: e.contentType,
  sizeBytes: e.sizeBytes,
  sha256: e.sha256,
});

/**
 * Write 1 of 2 on evidence — adds a file to an item. Its type is decided by its content (415 when
 * not an accepted kind); the bytes go to object storage, then the row and its audit entry in one
 * transaction. A locked sample refuses it (409) and a signed-off one loses its sign-offs (beginSampleWrite).
 */
export async function addItemEvidence(
  db: Knex,
  a: { engagementId: number; sampleId: number; itemId: number; actorId: number; fileName: string; bytes: Buffer },
): Promise<EvidenceRecord> {
  const sniff = await sniffEvidence(a.bytes, a.fileName);
  if (!sniff.ok) throw new AppError(415, "unsupported_evidence_type", sniff.reason);
  const sha256 = createHash("sha256").update(a.bytes).digest("hex");
  const objectKey = `engagements/${a.engagementId}/samples/${a.sampleId}/items/${a.itemId}/evidence/${sha256}-${randomUUID()}`;
  return db.transaction(async (trx) => {
    await beginSampleWrite(trx, { sampleId: a.sampleId, actorId: a.actorId, what: "evidence added" });
    await getItemOfSample(trx, { sampleId: a.sampleId, itemId: a.itemId });
    await putObjectBytes({ key: objectKey, bytes: a.bytes, contentType: sniff.contentType });
    return insertEvidenceRow(trx, {
      ...a,
      contentType: sniff.contentType,
      sizeBytes: a.bytes.length,
      sha256,
      objectKey,
      uploadedBy: a.actorId,
      audit: { action: "upload", kind: sniff.label },
    });
  });
}

/** The item_evidence row and its audit entry, for bytes already in storage (inside the caller's sample-write transaction). */
export async function insertEvidenceRow(
  trx: Knex.Transaction,
  a: {
    engagementId: number;
    sampleId: number;
    itemId: number;
    actorId: number;
    fileName: string;
    contentType: string;
    sizeBytes: number;
    sha256: string;
    objectKey: string;
    uploadedBy: number;
    audit: { action: string; [extra: string]: unknown };
  },
): Promise<EvidenceRecord> {
  const [id] = await trx("item_evidence").insert({
    sample_item_id: a.itemId,
    file_name: a.fileName,
    content_type: a.contentType,
    size_bytes: a.sizeBytes,
    sha256: a.sha256,
    object_key: a.objectKey,
    uploaded_by: a.uploadedBy,
  });
  const [row] = await evidenceQuery(trx).where("e.id", id);
  const evidence = toEvidence(row);
  const { action, ...extra } = a.audit;
  await recordAudit(trx, {
    actorUserId: a.actorId,
    engagementId: a.engagementId,
    sampleId: a.sampleId,
    entity: "item_evidence",
    entityId: id,
    action,
    after: { ...auditView(evidence), ...extra },
  });
  return evidence;
}

/**
 * Write 2 of 2 on evidence — removes a file from an item. Soft: the row and the stored object stay
 * for the audit trail, marked deleted by whom and when. Locked samples refuse it, as above.
 */
export async function deleteItemEvidence(
  db: Knex,
  a: {
    engagementId: number;
    sampleId: number;
    itemId: number;
    evidenceId: number;
    actorId: number;
    role: EngagementRole;
  },
): Promise<void> {
  await db.transaction(async (trx) => {
    await beginSampleWrite(trx, { sampleId: a.sampleId, actorId: a.actorId, what: "evidence removed" });
    await getItemOfSample(trx, { sampleId: a.sampleId, itemId: a.itemId });
    const row = await trx("item_evidence")
      .where({ id: a.evidenceId, sample_item_id: a.itemId })
      .whereNull("deleted_at")
      .forUpdate()
      .first();
    if (!row) throw notFound("No such evidence file");
    await trx("item_evidence")
      .where({ id: a.evidenceId })
      .update({ deleted_at: trx.fn.now(3), deleted_by: a.actorId });
    const before = {
      sampleItemId: a.itemId,
      fileName: row.file_name,
      contentType: row.content_type,
      sizeBytes: Number(row.size_bytes),
      sha256: row.sha256,
    };
    await recordAudit(trx, {
      actorUserId: a.actorId,
      engagementId: a.engagementId,
      sampleId: a.sampleId,
      entity: "item_evidence",
      entityId: a.evidenceId,
      action: "delete",
      before,
      after: { deleted: true },
    });
  });
}

/** What the API shows of an evidence file (the storage key stays on the server). */
export function publicEvidence({ objectKey: _key, ...rest }: EvidenceRecord) {
  return rest;
}
