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
import {
  findEvidenceById,
  insertItemEvidence,
  lockLiveEvidenceById,
  markEvidenceDeletedById,
  type EvidenceRecord,
} from "@/lib/data/item-evidence";

export { listEvidenceByItemId, type EvidenceRecord } from "@/lib/data/item-evidence";

/** Largest evidence file accepted. */
export const MAX_EVIDENCE_BYTES = 25 * 1024 * 1024;

/** The item, when it belongs to the sample's current draw (404 otherwise). */
export async function getItemOfSample(db: Knex, { sampleId, itemId }: { sampleId: number; itemId: number }) {
  const draw = await getCurrentDraw(db, { sampleId });
  if (!draw) throw notFound("No such item in this sample");
  return getItemById(db, { drawId: draw.id, itemId });
}

export async function getEvidenceById(db: Knex, { itemId, evidenceId }: { itemId: number; evidenceId: number }) {
  const evidence = await findEvidenceById(db, { itemId, evidenceId });
  if (!evidence) throw notFound("No such evidence file");
  return evidence;
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
  const evidence = await insertItemEvidence(trx, a);
  const { action, ...extra } = a.audit;
  await recordAudit(trx, {
    actorUserId: a.actorId,
    engagementId: a.engagementId,
    sampleId: a.sampleId,
    entity: "item_evidence",
    entityId: evidence.id,
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
    const row = await lockLiveEvidenceById(trx, { itemId: a.itemId, evidenceId: a.evidenceId });
    if (!row) throw notFound("No such evidence file");
    await markEvidenceDeletedById(trx, { evidenceId: a.evidenceId, actorId: a.actorId });
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
