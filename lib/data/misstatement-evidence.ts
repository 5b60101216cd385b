import "server-only";
import type { Knex } from "knex";
import type { MisstatementEntryEvidenceRow } from "./tables";

/** One evidence file on a misstatement entry (misstatement_entry_evidence). */
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

type EvidenceRow = MisstatementEntryEvidenceRow & { uploaded_by_name: string };

const toEvidence = (r: EvidenceRow): EntryEvidenceRecord => ({
  id: r.id,
  entryId: r.entry_id,
  fileName: r.file_name,
  contentType: r.content_type,
  sizeBytes: Number(r.size_bytes),
  sha256: r.sha256,
  objectKey: r.object_key,
  uploadedByName: r.uploaded_by_name ?? "",
  uploadedAt: new Date(r.uploaded_at).toISOString(),
  deletedAt: r.deleted_at ? new Date(r.deleted_at).toISOString() : null,
});

const query = (db: Knex) =>
  db("misstatement_entry_evidence as v")
    .join("users as u", "u.id", "v.uploaded_by")
    .select<EvidenceRow[]>("v.*", "u.name as uploaded_by_name");

/** The entry's files that are not removed, in the order they were added. */
export async function listEntryEvidenceByEntryId(db: Knex, { entryId }: { entryId: number }) {
  return (await query(db).where("v.entry_id", entryId).whereNull("v.deleted_at").orderBy("v.id")).map(toEvidence);
}

/** A file of the entry that is not removed, or null. */
export async function findEntryEvidenceById(
  db: Knex,
  { entryId, evidenceId }: { entryId: number; evidenceId: number },
): Promise<EntryEvidenceRecord | null> {
  const rows = await query(db).where({ "v.entry_id": entryId, "v.id": evidenceId }).whereNull("v.deleted_at").limit(1);
  return rows[0] ? toEvidence(rows[0]) : null;
}

/** Adds the row for a file already in storage; returns it as read back. */
export async function insertEntryEvidence(
  trx: Knex.Transaction,
  a: {
    entryId: number;
    fileName: string;
    contentType: string;
    sizeBytes: number;
    sha256: string;
    objectKey: string;
    uploadedBy: number;
  },
): Promise<EntryEvidenceRecord> {
  const [id] = await trx("misstatement_entry_evidence").insert({
    entry_id: a.entryId,
    file_name: a.fileName,
    content_type: a.contentType,
    size_bytes: a.sizeBytes,
    sha256: a.sha256,
    object_key: a.objectKey,
    uploaded_by: a.uploadedBy,
  });
  return toEvidence((await query(trx).where("v.id", id))[0]);
}

/** The file's row, not removed, locked to the end of the transaction; undefined when there is none. */
export async function lockLiveEntryEvidenceById(
  trx: Knex.Transaction,
  { entryId, evidenceId }: { entryId: number; evidenceId: number },
): Promise<MisstatementEntryEvidenceRow | undefined> {
  return trx("misstatement_entry_evidence")
    .where({ id: evidenceId, entry_id: entryId })
    .whereNull("deleted_at")
    .forUpdate()
    .first();
}

/** Soft removal: the row and the stored object stay, marked removed by whom and when. */
export async function markEntryEvidenceDeletedById(
  trx: Knex.Transaction,
  { evidenceId, actorId }: { evidenceId: number; actorId: number },
) {
  await trx("misstatement_entry_evidence")
    .where({ id: evidenceId })
    .update({ deleted_at: trx.fn.now(3), deleted_by: actorId });
}
