import "server-only";
import type { Knex } from "knex";
import { notFound } from "@/lib/errors";
import type { RequestItemStatus, RequestNeed } from "@/lib/validation/requests";

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

const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null);
const parse = (v: unknown) => (typeof v === "string" ? JSON.parse(v) : v) as RequestNeed[];

function toFile(r: Record<string, unknown>): RequestFileView {
  return {
    id: Number(r.id),
    fileName: String(r.file_name),
    contentType: String(r.content_type),
    sizeBytes: Number(r.size_bytes),
    sha256: String(r.sha256),
    uploadedAt: iso(r.uploaded_at)!,
    uploadedByName: String(r.uploaded_by_name),
    status: r.status as RequestFileView["status"],
    returnReason: (r.return_reason as string | null) ?? null,
    decidedAt: iso(r.decided_at),
    decidedByName: (r.decided_by_name as string | null) ?? null,
    evidenceId: r.evidence_id === null ? null : Number(r.evidence_id),
  };
}

/**
 * The items of a request list with their files. Only the request's own fields and the item's
 * reference and description are read, never the team's results or comments; the book value only
 * when asked for (the team always; the client when the list shows book values).
 */
export async function listRequestItems(
  db: Knex,
  { listId, withBookValues }: { listId: number; withBookValues: boolean },
): Promise<RequestItemView[]> {
  const [rows, files] = await Promise.all([
    db("request_items as r")
      .join("sample_items as i", "i.id", "r.sample_item_id")
      .where("r.request_list_id", listId)
      .orderBy("r.position")
      .select("r.*", "i.item_ref", "i.description", ...(withBookValues ? ["i.book_value"] : [])),
    db("request_files as f")
      .join("request_items as r", "r.id", "f.request_item_id")
      .join("users as u", "u.id", "f.uploaded_by")
      .leftJoin("users as d", "d.id", "f.decided_by")
      .where("r.request_list_id", listId)
      .orderBy("f.id")
      .select("f.*", "u.name as uploaded_by_name", "d.name as decided_by_name"),
  ]);
  return rows.map((r) => ({
    id: Number(r.id),
    sampleItemId: Number(r.sample_item_id),
    position: Number(r.position),
    itemRef: String(r.item_ref),
    description: r.description ?? null,
    ...(withBookValues ? { bookValue: String(r.book_value) } : {}),
    needs: parse(r.needs_json),
    needsNote: r.needs_note ?? null,
    status: r.status as RequestItemStatus,
    clientNote: r.client_note ?? null,
    returnReason: r.return_reason ?? null,
    updatedAt: iso(r.updated_at)!,
    files: files.filter((f) => Number(f.request_item_id) === Number(r.id)).map(toFile),
  }));
}

/** One item of a list, locked for update (404 when it is not on the list). */
export async function lockRequestItem(
  trx: Knex.Transaction,
  { listId, requestItemId }: { listId: number; requestItemId: number },
) {
  const row = await trx("request_items").where({ id: requestItemId, request_list_id: listId }).forUpdate().first();
  if (!row) throw notFound("No such item on this request list");
  return { id: Number(row.id), sampleItemId: Number(row.sample_item_id), status: row.status };
}

/** A client file of a list with its item, locked for update (404 when it is not on the list). */
export async function lockRequestFile(trx: Knex.Transaction, { listId, fileId }: { listId: number; fileId: number }) {
  const row = await trx("request_files as f")
    .join("request_items as r", "r.id", "f.request_item_id")
    .where({ "f.id": fileId, "r.request_list_id": listId })
    .forUpdate()
    .first("f.*", "r.sample_item_id", "r.status as item_status");
  if (!row) throw notFound("No such file on this request list");
  return row as Record<string, unknown> & {
    request_item_id: number;
    sample_item_id: number;
    item_status: RequestItemStatus;
    status: string;
    object_key: string;
  };
}

/** Files of an item still awaiting the team, not counting `exceptFileId`. */
export async function countPendingFiles(
  trx: Knex.Transaction,
  { requestItemId, exceptFileId }: { requestItemId: number; exceptFileId?: number },
) {
  const q = trx("request_files").where({ request_item_id: requestItemId, status: "pending" });
  if (exceptFileId) q.whereNot({ id: exceptFileId });
  const row = await q.count({ n: "*" }).first();
  return Number(row?.n ?? 0);
}
