import "server-only";
/** Evidence files on the team's misstatement entries: the same checks and storage as evidence on sample items (lib/fieldwork/evidence.ts). */
import { createHash, randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { getEntryById } from "@/lib/data/misstatements";
import { AppError, notFound } from "@/lib/errors";
import { sniffEvidence } from "@/lib/files/sniff-evidence";
import { putObjectBytes } from "@/lib/storage/objects";
import { beginSummaryWrite } from "./guard";

export interface EntryEvidenceRecord {
  id: number;
  entryId: number;
  fileName: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  objectKey: string;
  uploadedByName: string;
  uploadedAt: string;
  deletedAt: string | null;
}

const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null);
const toEvidence = (r: Record<string, unknown>): EntryEvidenceRecord => ({
  id: Number(r.id),
  entryId: Number(r.entry_id),
  fileName: String(r.file_name),
  contentType: String(r.content_type),
  sizeBytes: Number(r.size_bytes),
  sha256: String(r.sha256),
  objectKey: String(r.object_key),
  uploadedByName: String(r.uploaded_by_name ?? ""),
  uploadedAt: iso(r.uploaded_at)!,
  deletedAt: iso(r.deleted_at),
});
const query = (db: Knex) =>
  db("misstatement_entry_evidence as v")
    .join("users as u", "u.id", "v.uploaded_by")
    .select("v.*", "u.name as uploaded_by_name");

export async function listEntryEvidence(db: Knex, { entryId }: { entryId: number }) {
  return (await query(db).where("v.entry_id", entryId).whereNull("v.deleted_at").orderBy("v.id")).map(toEvidence);
}

export async function getEntryEvidence(db: Knex, { entryId, evidenceId }: { entryId: number; evidenceId: number }) {
  const row = await query(db).where({ "v.entry_id": entryId, "v.id": evidenceId }).whereNull("v.deleted_at").first();
  if (!row) throw notFound("No such evidence file");
  return toEvidence(row);
}

export async function addEntryEvidence(
  db: Knex,
  a: { engagementId: number; entryId: number; actorId: number; fileName: string; bytes: Buffer },
) {
  const sniff = await sniffEvidence(a.bytes, a.fileName);
  if (!sniff.ok) throw new AppError(415, "unsupported_evidence_type", sniff.reason);
  const sha256 = createHash("sha256").update(a.bytes).digest("hex");
  const objectKey = `engagements/${a.engagementId}/misstatements/${a.entryId}/evidence/${sha256}-${randomUUID()}`;
  return db.transaction(async (trx) => {
    await beginSummaryWrite(trx, {
      engagementId: a.engagementId,
      actorId: a.actorId,
      what: `evidence added to entry ${a.entryId}`,
    });
    await getEntryById(trx, { engagementId: a.engagementId, entryId: a.entryId });
    await putObjectBytes({ key: objectKey, bytes: a.bytes, contentType: sniff.contentType });
    const [id] = await trx("misstatement_entry_evidence").insert({
      entry_id: a.entryId,
      file_name: a.fileName,
      content_type: sniff.contentType,
      size_bytes: a.bytes.length,
      sha256,
      object_key: objectKey,
      uploaded_by: a.actorId,
    });
    await recordAudit(trx, {
      actorUserId: a.actorId,
      engagementId: a.engagementId,
      entity: "misstatement_evidence",
      entityId: id,
      action: "upload",
      after: {
        entryId: a.entryId,
        fileName: a.fileName,
        contentType: sniff.contentType,
        sizeBytes: a.bytes.length,
        sha256,
      },
    });
    return toEvidence((await query(trx).where("v.id", id))[0]);
  });
}

export async function deleteEntryEvidence(
  db: Knex,
  a: { engagementId: number; entryId: number; evidenceId: number; actorId: number },
) {
  await db.transaction(async (trx) => {
    await beginSummaryWrite(trx, {
      engagementId: a.engagementId,
      actorId: a.actorId,
      what: `evidence removed from entry ${a.entryId}`,
    });
    await getEntryById(trx, { engagementId: a.engagementId, entryId: a.entryId });
    const row = await trx("misstatement_entry_evidence")
      .where({ id: a.evidenceId, entry_id: a.entryId })
      .whereNull("deleted_at")
      .forUpdate()
      .first();
    if (!row) throw notFound("No such evidence file");
    await trx("misstatement_entry_evidence")
      .where({ id: a.evidenceId })
      .update({ deleted_at: trx.fn.now(3), deleted_by: a.actorId });
    await recordAudit(trx, {
      actorUserId: a.actorId,
      engagementId: a.engagementId,
      entity: "misstatement_evidence",
      entityId: a.evidenceId,
      action: "delete",
      before: { entryId: a.entryId, fileName: row.file_name, sha256: row.sha256 },
      after: { deleted: true },
    });
  });
}

export function publicEntryEvidence({ objectKey: _key, ...rest }: EntryEvidenceRecord) {
  return rest;
}
