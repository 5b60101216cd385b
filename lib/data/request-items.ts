import "server-only";
import type { Knex } from "knex";
import { z } from "zod";
import { notFound } from "@/lib/errors";
import { REQUEST_NEEDS, type RequestItemStatus, type RequestNeed } from "@/lib/validation/requests";
import { parseJsonColumn } from "./json-column";
import { mustExist } from "./must-exist";
import type { RequestFilesRow, RequestItemsRow } from "./tables";

// The items of request lists and the files the client sends on them.

export interface RequestFileView {
  id: number;
  fileName: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  uploadedAt: string;
  uploadedByName: string;
  status: "pending" | "accepted" | "returned";
  returnReason: string | null;
  decidedAt: string | null;
  decidedByName: string | null;
  evidenceId: number | null;
}

export interface RequestItemView {
  id: number;
  sampleItemId: number;
  position: number;
  itemRef: string;
  description: string | null;
  /** Present for the audit team always, for the client only when the list shows book values. */
  bookValue?: string;
  needs: RequestNeed[];
  needsNote: string | null;
  status: RequestItemStatus;
  clientNote: string | null;
  returnReason: string | null;
  updatedAt: string;
  files: RequestFileView[];
}

/** request_items.needs_json: what the list asks for on each item, as written from CreateRequestListSchema. */
const NeedsSchema = z.array(z.enum(REQUEST_NEEDS));

const iso = (v: Date | string | null) => (v ? new Date(v).toISOString() : null);

type JoinedFile = RequestFilesRow & { uploaded_by_name: string; decided_by_name: string | null };
type JoinedItem = RequestItemsRow & { item_ref: string; description: string | null; book_value?: string };

function toFile(r: JoinedFile): RequestFileView {
  return {
    id: Number(r.id),
    fileName: String(r.file_name),
    contentType: String(r.content_type),
    sizeBytes: Number(r.size_bytes),
    sha256: String(r.sha256),
    uploadedAt: new Date(r.uploaded_at).toISOString(),
    uploadedByName: String(r.uploaded_by_name),
    status: r.status,
    returnReason: r.return_reason ?? null,
    decidedAt: iso(r.decided_at),
    decidedByName: r.decided_by_name ?? null,
    evidenceId: r.evidence_id === null ? null : Number(r.evidence_id),
  };
}

/**
 * The items of a request list with their files. Only the request's own fields and the item's
 * reference and description are read, never the team's results or comments; the book value only
 * when asked for (the team always; the client when the list shows book values).
 */
export async function listRequestItemsByListId(
  db: Knex | Knex.Transaction,
  { listId, withBookValues }: { listId: number; withBookValues: boolean },
): Promise<RequestItemView[]> {
  const [rows, files] = await Promise.all([
    db("request_items as r")
      .join("sample_items as i", "i.id", "r.sample_item_id")
      .where("r.request_list_id", listId)
      .orderBy("r.position")
      .select<JoinedItem[]>("r.*", "i.item_ref", "i.description", ...(withBookValues ? ["i.book_value"] : [])),
    db("request_files as f")
      .join("request_items as r", "r.id", "f.request_item_id")
      .join("users as u", "u.id", "f.uploaded_by")
      .leftJoin("users as d", "d.id", "f.decided_by")
      .where("r.request_list_id", listId)
      .orderBy("f.id")
      .select<JoinedFile[]>("f.*", "u.name as uploaded_by_name", "d.name as decided_by_name"),
  ]);
  return rows.map((r) => ({
    id: Number(r.id),
    sampleItemId: Number(r.sample_item_id),
    position: Number(r.position),
    itemRef: String(r.item_ref),
    description: r.description ?? null,
    ...(withBookValues ? { bookValue: String(r.book_value) } : {}),
    needs: parseJsonColumn(NeedsSchema, r.needs_json, "request_items.needs_json"),
    needsNote: r.needs_note ?? null,
    status: r.status,
    clientNote: r.client_note ?? null,
    returnReason: r.return_reason ?? null,
    updatedAt: new Date(r.updated_at).toISOString(),
    files: files.filter((f) => Number(f.request_item_id) === Number(r.id)).map(toFile),
  }));
}

/** The list's items, in the order given, each asking for the same things. */
export async function insertRequestItems(
  trx: Knex.Transaction,
  {
    listId,
    sampleItemIds,
    needs,
    needsNote,
  }: { listId: number; sampleItemIds: number[]; needs: RequestNeed[]; needsNote: string | null },
) {
  const needsJson = JSON.stringify(needs);
  await trx("request_items").insert(
    sampleItemIds.map((sampleItemId, i) => ({
      request_list_id: listId,
      sample_item_id: sampleItemId,
      position: i + 1,
      needs_json: needsJson,
      needs_note: needsNote,
    })),
  );
}

export async function countRequestItemsByListId(db: Knex | Knex.Transaction, { listId }: { listId: number }) {
  const row = await db("request_items").where({ request_list_id: listId }).count({ n: "*" }).first();
  return Number(row?.n ?? 0);
}

/** One item of a list, locked for update (404 when it is not on the list). */
export async function lockRequestItemById(
  trx: Knex.Transaction,
  { listId, requestItemId }: { listId: number; requestItemId: number },
) {
  const row = await trx("request_items").where({ id: requestItemId, request_list_id: listId }).forUpdate().first();
  if (!row) throw notFound("No such item on this request list");
  return {
    id: Number(row.id),
    sampleItemId: Number(row.sample_item_id),
    status: row.status,
    clientNote: row.client_note,
  };
}

/** A client file of a list with its item, locked for update (404 when it is not on the list). */
export async function lockRequestFileById(
  trx: Knex.Transaction,
  { listId, fileId }: { listId: number; fileId: number },
) {
  const row = await trx("request_files as f")
    .join("request_items as r", "r.id", "f.request_item_id")
    .where({ "f.id": fileId, "r.request_list_id": listId })
    .forUpdate()
    .first<(RequestFilesRow & { sample_item_id: number; item_status: RequestItemStatus }) | undefined>(
      "f.*",
      "r.sample_item_id",
      "r.status as item_status",
    );
  if (!row) throw notFound("No such file on this request list");
  return row;
}

export interface RequestFileRecord {
  objectKey: string;
  fileName: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  uploadedBy: number;
}

/** A file of a request list as stored; null when it is not on the list. */
export async function getRequestFileById(
  db: Knex | Knex.Transaction,
  { listId, fileId }: { listId: number; fileId: number },
): Promise<RequestFileRecord | null> {
  const row = await db("request_files as f")
    .join("request_items as r", "r.id", "f.request_item_id")
    .where({ "f.id": fileId, "r.request_list_id": listId })
    .first<RequestFilesRow | undefined>("f.*");
  if (!row) return null;
  return {
    objectKey: String(row.object_key),
    fileName: String(row.file_name),
    contentType: String(row.content_type),
    sizeBytes: Number(row.size_bytes),
    sha256: String(row.sha256),
    uploadedBy: Number(row.uploaded_by),
  };
}

/** Files of an item still awaiting the team, not counting `exceptFileId`. */
export async function countPendingFilesByItemId(
  trx: Knex.Transaction,
  { requestItemId, exceptFileId }: { requestItemId: number; exceptFileId?: number },
) {
  const q = trx("request_files").where({ request_item_id: requestItemId, status: "pending" });
  if (exceptFileId) q.whereNot({ id: exceptFileId });
  const row = await q.count({ n: "*" }).first();
  return Number(row?.n ?? 0);
}

export async function insertRequestFile(
  trx: Knex.Transaction,
  a: {
    requestItemId: number;
    fileName: string;
    contentType: string;
    sizeBytes: number;
    sha256: string;
    objectKey: string;
    uploadedBy: number;
  },
): Promise<number> {
  const [id] = await trx("request_files").insert({
    request_item_id: a.requestItemId,
    file_name: a.fileName,
    content_type: a.contentType,
    size_bytes: a.sizeBytes,
    sha256: a.sha256,
    object_key: a.objectKey,
    uploaded_by: a.uploadedBy,
  });
  return Number(id);
}

/** The team's decision on a client file: accepted (with the evidence row it became) or returned with a reason. */
export async function decideRequestFileById(
  trx: Knex.Transaction,
  a:
    | { fileId: number; actorId: number; status: "accepted"; evidenceId: number }
    | { fileId: number; actorId: number; status: "returned"; returnReason: string },
) {
  await trx("request_files")
    .where({ id: a.fileId })
    .update({
      status: a.status,
      decided_by: a.actorId,
      decided_at: trx.fn.now(3),
      ...(a.status === "accepted" ? { evidence_id: a.evidenceId } : { return_reason: a.returnReason }),
    });
}

/** Moves an item to a status; `returnReason` is set when given (null clears it). */
export async function setRequestItemStatusById(
  trx: Knex.Transaction,
  {
    requestItemId,
    status,
    returnReason,
  }: { requestItemId: number; status: RequestItemStatus; returnReason?: string | null },
) {
  await trx("request_items")
    .where({ id: requestItemId })
    .update({
      status,
      ...(returnReason !== undefined ? { return_reason: returnReason } : {}),
      updated_at: trx.fn.now(3),
    });
}

export async function setRequestItemClientNoteById(
  trx: Knex.Transaction,
  { requestItemId, note }: { requestItemId: number; note: string | null },
) {
  await trx("request_items")
    .where({ id: requestItemId })
    .update({ client_note: note, updated_at: trx.fn.now(3) });
}

/** The reference of the sample item a request item asks about. */
export async function getItemRefByRequestItemId(
  db: Knex | Knex.Transaction,
  { requestItemId }: { requestItemId: number },
) {
  const row = await db("request_items as r")
    .join("sample_items as i", "i.id", "r.sample_item_id")
    .where("r.id", requestItemId)
    .first<{ item_ref: string } | undefined>("i.item_ref");
  return mustExist(row, `request item ${requestItemId}`).item_ref;
}
