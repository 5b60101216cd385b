import "server-only";
import { createHash, randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { AppError, conflict } from "@/lib/errors";
import { insertEvidenceRow } from "@/lib/fieldwork/evidence";
import { sniffEvidence } from "@/lib/files/sniff-evidence";
import { assertSampleUnlocked, beginSampleWrite } from "@/lib/samples/guard";
import { putObjectBytes } from "@/lib/storage/objects";
import { closedListError, type RequestListRow } from "./lists";
import { countPendingFiles, lockRequestFile, lockRequestItem } from "./items";
import { itemStatusAfter } from "./status";
import { mustExist } from "@/lib/data/must-exist";

const audit = (list: RequestListRow) => ({ engagementId: list.engagementId, sampleId: list.sampleId });

async function assertListOpen(trx: Knex.Transaction, list: RequestListRow) {
  const row = mustExist(
    await trx("request_lists").where({ id: list.id }).forUpdate().first("status", "closed_reason"),
    `request list ${list.id}`,
  );
  if (row.status !== "open") throw closedListError({ closedReason: row.closed_reason });
}

/**
 * The client uploads one file to a requested item: typed by its content as evidence is (415 when
 * refused), stored, and the item becomes "provided". A closed list or a locked sample answers 409.
 */
export async function addClientFile(
  db: Knex,
  a: { list: RequestListRow; requestItemId: number; actorId: number; fileName: string; bytes: Buffer },
) {
  const sniff = await sniffEvidence(a.bytes, a.fileName);
  if (!sniff.ok) throw new AppError(415, "unsupported_evidence_type", sniff.reason);
  const sha256 = createHash("sha256").update(a.bytes).digest("hex");
  const key = `engagements/${a.list.engagementId}/samples/${a.list.sampleId}/requests/${a.list.id}/items/${a.requestItemId}/${sha256}-${randomUUID()}`;
  return db.transaction(async (trx) => {
    await assertListOpen(trx, a.list);
    await assertSampleUnlocked(trx, a.list.sampleId).catch(() => {
      throw closedListError({ closedReason: "the sample was locked" });
    });
    const item = await lockRequestItem(trx, { listId: a.list.id, requestItemId: a.requestItemId });
    let status;
    try {
      status = itemStatusAfter(item.status, "client-upload", { pendingLeft: 0 });
    } catch {
      throw conflict("This item was already accepted by the audit team; nothing more is needed for it.");
    }
    await putObjectBytes({ key, bytes: a.bytes, contentType: sniff.contentType });
    const [id] = await trx("request_files").insert({
      request_item_id: item.id,
      file_name: a.fileName,
      content_type: sniff.contentType,
      size_bytes: a.bytes.length,
      sha256,
      object_key: key,
      uploaded_by: a.actorId,
    });
    await trx("request_items")
      .where({ id: item.id })
      .update({ status, updated_at: trx.fn.now(3) });
    await recordAudit(trx, {
      actorUserId: a.actorId,
      ...audit(a.list),
      entity: "request_file",
      entityId: id,
      action: "client-upload",
      after: {
        requestListId: a.list.id,
        requestItemId: item.id,
        fileName: a.fileName,
        contentType: sniff.contentType,
        sizeBytes: a.bytes.length,
        sha256,
        kind: sniff.label,
        itemStatus: status,
      },
    });
    return {
      id: id,
      fileName: a.fileName,
      contentType: sniff.contentType,
      sizeBytes: a.bytes.length,
      sha256,
      itemStatus: status,
    };
  });
}

/** The client's note on an item (empty clears it); refused on a closed list. */
export async function setClientNote(
  db: Knex,
  a: { list: RequestListRow; requestItemId: number; actorId: number; note: string },
) {
  await db.transaction(async (trx) => {
    await assertListOpen(trx, a.list);
    const item = await lockRequestItem(trx, { listId: a.list.id, requestItemId: a.requestItemId });
    const before = mustExist(
      await trx("request_items").where({ id: item.id }).first("client_note"),
      `request item ${item.id}`,
    );
    await trx("request_items")
      .where({ id: item.id })
      .update({ client_note: a.note || null, updated_at: trx.fn.now(3) });
    await recordAudit(trx, {
      actorUserId: a.actorId,
      ...audit(a.list),
      entity: "request_item",
      entityId: item.id,
      action: "client-note",
      before: { note: before.client_note },
      after: { note: a.note || null },
    });
  });
}

/**
 * The team accepts a client file: it becomes evidence on the sample item (same stored object, an
 * item_evidence row), the item is "accepted". A sample write, so a locked sample answers 409 and
 * sign-offs are cleared (beginSampleWrite).
 */
export async function acceptClientFile(db: Knex, a: { list: RequestListRow; fileId: number; actorId: number }) {
  return db.transaction(async (trx) => {
    await beginSampleWrite(trx, {
      sampleId: a.list.sampleId,
      actorId: a.actorId,
      what: "a client file accepted as evidence",
    });
    const file = await lockRequestFile(trx, { listId: a.list.id, fileId: a.fileId });
    if (file.status !== "pending") throw conflict(`This file was already ${file.status}.`);
    const evidence = await insertEvidenceRow(trx, {
      ...audit(a.list),
      itemId: Number(file.sample_item_id),
      actorId: a.actorId,
      fileName: String(file.file_name),
      contentType: String(file.content_type),
      sizeBytes: Number(file.size_bytes),
      sha256: String(file.sha256),
      objectKey: file.object_key,
      uploadedBy: Number(file.uploaded_by),
      audit: { action: "accept-client-file", requestFileId: a.fileId, requestListId: a.list.id },
    });
    const status = itemStatusAfter(file.item_status, "file-accepted", { pendingLeft: 0 });
    await trx("request_files")
      .where({ id: a.fileId })
      .update({ status: "accepted", decided_by: a.actorId, decided_at: trx.fn.now(3), evidence_id: evidence.id });
    await trx("request_items")
      .where({ id: file.request_item_id })
      .update({ status, return_reason: null, updated_at: trx.fn.now(3) });
    await recordAudit(trx, {
      actorUserId: a.actorId,
      ...audit(a.list),
      entity: "request_file",
      entityId: a.fileId,
      action: "accept",
      before: { status: "pending" },
      after: { status: "accepted", evidenceId: evidence.id, itemStatus: status },
    });
    return { evidenceId: evidence.id, itemStatus: status };
  });
}

/** The team sends a client file back with a reason; the item needs more unless another file awaits. The caller e-mails the client. */
export async function returnClientFile(
  db: Knex,
  a: { list: RequestListRow; fileId: number; actorId: number; reason: string },
) {
  return db.transaction(async (trx) => {
    await assertListOpen(trx, a.list);
    await assertSampleUnlocked(trx, a.list.sampleId);
    const file = await lockRequestFile(trx, { listId: a.list.id, fileId: a.fileId });
    if (file.status !== "pending") throw conflict(`This file was already ${file.status}.`);
    const pendingLeft = await countPendingFiles(trx, { requestItemId: file.request_item_id, exceptFileId: a.fileId });
    const status = itemStatusAfter(file.item_status, "file-returned", { pendingLeft });
    await trx("request_files")
      .where({ id: a.fileId })
      .update({ status: "returned", decided_by: a.actorId, decided_at: trx.fn.now(3), return_reason: a.reason });
    await trx("request_items")
      .where({ id: file.request_item_id })
      .update({ status, return_reason: a.reason, updated_at: trx.fn.now(3) });
    await recordAudit(trx, {
      actorUserId: a.actorId,
      ...audit(a.list),
      entity: "request_file",
      entityId: a.fileId,
      action: "return",
      before: { status: "pending" },
      after: { status: "returned", reason: a.reason, itemStatus: status },
    });
    const item = await trx("request_items as r")
      .join("sample_items as i", "i.id", "r.sample_item_id")
      .where("r.id", file.request_item_id)
      .first("i.item_ref");
    return { itemStatus: status, itemRef: String(item.item_ref), fileName: String(file.file_name) };
  });
}
