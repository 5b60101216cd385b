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
import {
  findEntryEvidenceById,
  insertEntryEvidence,
  listEntryEvidenceByEntryId,
  lockLiveEntryEvidenceById,
  markEntryEvidenceDeletedById,
  type EntryEvidenceRecord,
} from "@/lib/data/misstatement-evidence";

export type { EntryEvidenceRecord } from "@/lib/data/misstatement-evidence";

export const listEntryEvidence = listEntryEvidenceByEntryId;

export async function getEntryEvidence(db: Knex, { entryId, evidenceId }: { entryId: number; evidenceId: number }) {
  const evidence = await findEntryEvidenceById(db, { entryId, evidenceId });
  if (!evidence) throw notFound("No such evidence file");
  return evidence;
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
    const evidence = await insertEntryEvidence(trx, {
      entryId: a.entryId,
      fileName: a.fileName,
      contentType: sniff.contentType,
      sizeBytes: a.bytes.length,
      sha256,
      objectKey,
      uploadedBy: a.actorId,
    });
    await recordAudit(trx, {
      actorUserId: a.actorId,
      engagementId: a.engagementId,
      entity: "misstatement_evidence",
      entityId: evidence.id,
      action: "upload",
      after: {
        entryId: a.entryId,
        fileName: a.fileName,
        contentType: sniff.contentType,
        sizeBytes: a.bytes.length,
        sha256,
      },
    });
    return evidence;
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
    const row = await lockLiveEntryEvidenceById(trx, { entryId: a.entryId, evidenceId: a.evidenceId });
    if (!row) throw notFound("No such evidence file");
    await markEntryEvidenceDeletedById(trx, { evidenceId: a.evidenceId, actorId: a.actorId });
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
