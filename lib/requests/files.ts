import "server-only";
import { createHash, randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { AppError, conflict } from "@/lib/errors";
import { insertEvidenceRow } from "@/lib/fieldwork/evidence";
import { sniffEvidence } from "@/lib/files/sniff-evidence";
import { assertSampleUnlocked, beginSampleWrite } from "@/lib/samples/guard";
import { putObjectBytes } from "@/lib/storage/objects";
import { lockRequestListById, type RequestListRow } from "@/lib/data/request-lists";
import {
  countPendingFilesByItemId,
  decideRequestFileById,
  getItemRefByRequestItemId,
  insertRequestFile,
  lockRequestFileById,
  lockRequestItemById,
  setRequestItemClientNoteById,
  setRequestItemStatusById,
} from "@/lib/data/request-items";
import { closedListError } from "./lists";
import { itemStatusAfter } from "./status";

const audit = (list: RequestListRow) => ({ engagementId: list.engagementId, sampleId: list.sampleId });

async function assertListOpen(trx: Knex.Transaction, list: RequestListRow) {
  const row = await lockRequestListById(trx, { listId: list.id });
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
    const item = await lockRequestItemById(trx, { listId: a.list.id, requestItemId: a.requestItemId });
    let status;
    try {
      status = itemStatusAfter(item.status, "client-upload", { pendingLeft: 0 });
    } catch {
      throw conflict("This item was already accepted by the audit team; nothing more is needed for it.");
    }
    await putObjectBytes({ key, bytes: a.bytes, contentType: sniff.contentType });
    const id = await insertRequestFile(trx, {
      requestItemId: item.id,
      fileName: a.fileName,
      contentType: sniff.contentType,
      sizeBytes: a.bytes.length,
      sha256,
      objectKey: key,
      uploadedBy: a.actorId,
    });
    await setRequestItemStatusById(trx, { requestItemId: item.id, status });
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
    const item = await lockRequestItemById(trx, { listId: a.list.id, requestItemId: a.requestItemId });
    await setRequestItemClientNoteById(trx, { requestItemId: item.id, note: a.note || null });
    await recordAudit(trx, {
      actorUserId: a.actorId,
      ...audit(a.list),
      entity: "request_item",
      entityId: item.id,
      action: "client-note",
      before: { note: item.clientNote },
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
    const file = await lockRequestFileById(trx, { listId: a.list.id, fileId: a.fileId });
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
    await decideRequestFileById(trx, {
      fileId: a.fileId,
      actorId: a.actorId,
      status: "accepted",
      evidenceId: evidence.id,
    });
    await setRequestItemStatusById(trx, { requestItemId: file.request_item_id, status, returnReason: null });
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
    const file = await lockRequestFileById(trx, { listId: a.list.id, fileId: a.fileId });
    if (file.status !== "pending") throw conflict(`This file was already ${file.status}.`);
    const pendingLeft = await countPendingFilesByItemId(trx, {
      requestItemId: file.request_item_id,
      exceptFileId: a.fileId,
    });
    const status = itemStatusAfter(file.item_status, "file-returned", { pendingLeft });
    await decideRequestFileById(trx, {
      fileId: a.fileId,
      actorId: a.actorId,
      status: "returned",
      returnReason: a.reason,
    });
    await setRequestItemStatusById(trx, { requestItemId: file.request_item_id, status, returnReason: a.reason });
    await recordAudit(trx, {
      actorUserId: a.actorId,
      ...audit(a.list),
      entity: "request_file",
      entityId: a.fileId,
      action: "return",
      before: { status: "pending" },
      after: { status: "returned", reason: a.reason, itemStatus: status },
    });
    const itemRef = await getItemRefByRequestItemId(trx, { requestItemId: file.request_item_id });
    return { itemStatus: status, itemRef, fileName: file.file_name };
  });
}
