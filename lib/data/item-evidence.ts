import "server-only";
import type { Knex } from "knex";
import type { ItemEvidenceRow } from "./tables";

/** One evidence file on a sample item (item_evidence), with the names of who added and removed it. */
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

type EvidenceRow = ItemEvidenceRow & { uploaded_by_name: string; deleted_by_name: string | null };

function toEvidence(r: EvidenceRow): EvidenceRecord {
  return {
    id: r.id,
    sampleItemId: r.sample_item_id,
    fileName: r.file_name,
    contentType: r.content_type,
    sizeBytes: Number(r.size_bytes),
    sha256: r.sha256,
    objectKey: r.object_key,
    uploadedById: r.uploaded_by,
    uploadedByName: r.uploaded_by_name ?? "",
    uploadedAt: new Date(r.uploaded_at).toISOString(),
    deletedAt: r.deleted_at ? new Date(r.deleted_at).toISOString() : null,
    deletedByName: r.deleted_by_name ?? null,
  };
}

const evidenceQuery = (db: Knex) =>
  db("item_evidence as e")
    .join("users as u", "u.id", "e.uploaded_by")
    .leftJoin("users as d", "d.id", "e.deleted_by")
    .select<EvidenceRow[]>("e.*", "u.name as uploaded_by_name", "d.name as deleted_by_name");

/** The item's files in the order they were added; removed ones only when asked. */
export async function listEvidenceByItemId(
  db: Knex,
  { itemId, includeDeleted = false }: { itemId: number; includeDeleted?: boolean },
): Promise<EvidenceRecord[]> {
  const q = evidenceQuery(db).where("e.sample_item_id", itemId).orderBy("e.id");
  if (!includeDeleted) q.whereNull("e.deleted_at");
  return (await q).map(toEvidence);
}

/** A file of the item that is not removed, or null. */
export async function findEvidenceById(
  db: Knex,
  { itemId, evidenceId }: { itemId: number; evidenceId: number },
): Promise<EvidenceRecord | null> {
  const rows = await evidenceQuery(db)
    .where({ "e.id": evidenceId, "e.sample_item_id": itemId })
    .whereNull("e.deleted_at")
    .limit(1);
  return rows[0] ? toEvidence(rows[0]) : null;
}

/** Adds the row for a file already in storage; returns it as read back. */
export async function insertItemEvidence(
  trx: Knex.Transaction,
  a: {
    itemId: number;
    fileName: string;
    contentType: string;
    sizeBytes: number;
    sha256: string;
    objectKey: string;
    uploadedBy: number;
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
  return toEvidence(row);
}

/** The file's row, not removed, locked to the end of the transaction; undefined when there is none. */
export async function lockLiveEvidenceById(
  trx: Knex.Transaction,
  { itemId, evidenceId }: { itemId: number; evidenceId: number },
): Promise<ItemEvidenceRow | undefined> {
  return trx("item_evidence")
    .where({ id: evidenceId, sample_item_id: itemId })
    .whereNull("deleted_at")
    .forUpdate()
    .first();
}

/** Soft removal: the row and the stored object stay, marked removed by whom and when. */
export async function markEvidenceDeletedById(
  trx: Knex.Transaction,
  { evidenceId, actorId }: { evidenceId: number; actorId: number },
) {
  await trx("item_evidence")
    .where({ id: evidenceId })
    .update({ deleted_at: trx.fn.now(3), deleted_by: actorId });
}

/** The draw's files that are not removed, in item order, with the item's reference (the workpaper's evidence index). */
export async function listEvidenceIndexByDrawId(db: Knex, { drawId }: { drawId: number }) {
  const rows = await db("item_evidence as e")
    .join("sample_items as i", "i.id", "e.sample_item_id")
    .join("users as u", "u.id", "e.uploaded_by")
    .where("i.draw_id", drawId)
    .whereNull("e.deleted_at")
    .orderBy("i.selection_order")
    .orderBy("e.id")
    .select<{ item_ref: string; file_name: string; sha256: string; name: string; uploaded_at: Date }[]>(
      "i.item_ref",
      "e.file_name",
      "e.sha256",
      "u.name",
      "e.uploaded_at",
    );
  return rows.map((r) => ({
    reference: r.item_ref,
    fileName: r.file_name,
    sha256: r.sha256,
    uploadedBy: r.name,
    uploadedAt: new Date(r.uploaded_at).toISOString(),
  }));
}
