import "server-only";
import type { Knex } from "knex";
import { notFound } from "@/lib/errors";
import type { RequestItemStatus } from "@/lib/validation/requests";
import type { RequestListsRow } from "./tables";
import { mustExist } from "./must-exist";

export interface RequestListRow {
  id: number;
  engagementId: number;
  sampleId: number;
  title: string;
  message: string | null;
  contactUserId: number;
  contactName: string;
  contactEmail: string;
  dueDate: string;
  showBookValues: boolean;
  status: "open" | "closed";
  closedReason: string | null;
  createdById: number;
  createdByName: string;
  createdAt: string;
}

export interface RequestListSummary extends RequestListRow {
  counts: Record<RequestItemStatus, number>;
  total: number;
}

type JoinedList = RequestListsRow & { contact_name: string; contact_email: string; created_by_name: string };

function toList(r: JoinedList): RequestListRow {
  return {
    id: Number(r.id),
    engagementId: Number(r.engagement_id),
    sampleId: Number(r.sample_id),
    title: String(r.title),
    message: r.message ?? null,
    contactUserId: Number(r.contact_user_id),
    contactName: String(r.contact_name),
    contactEmail: String(r.contact_email),
    dueDate: String(r.due_date),
    showBookValues: Boolean(r.show_book_values),
    status: r.status,
    closedReason: r.closed_reason ?? null,
    createdById: Number(r.created_by),
    createdByName: String(r.created_by_name),
    createdAt: new Date(r.created_at).toISOString(),
  };
}

const listQuery = (db: Knex | Knex.Transaction) =>
  db("request_lists as l")
    .join("users as c", "c.id", "l.contact_user_id")
    .join("users as b", "b.id", "l.created_by")
    .select<JoinedList[]>("l.*", "c.name as contact_name", "c.email as contact_email", "b.name as created_by_name");

/** A list the audit team sees: on this engagement and sample (404 otherwise). */
export async function getRequestListById(
  db: Knex | Knex.Transaction,
  { engagementId, sampleId, listId }: { engagementId: number; sampleId: number; listId: number },
) {
  const row = await listQuery(db)
    .where({ "l.id": listId, "l.engagement_id": engagementId, "l.sample_id": sampleId })
    .first();
  if (!row) throw notFound("No such request list");
  return toList(row);
}

/** A list as its client contact reaches it: addressed to them, and they are still a client contact on its engagement; null otherwise. */
export async function getContactRequestListById(
  db: Knex | Knex.Transaction,
  { listId, contactUserId }: { listId: number; contactUserId: number },
): Promise<RequestListRow | null> {
  const row = await listQuery(db)
    .join("engagement_members as m", (j) =>
      j.on("m.engagement_id", "l.engagement_id").andOn("m.user_id", "l.contact_user_id"),
    )
    .where({ "l.id": listId, "l.contact_user_id": contactUserId, "m.role": "client" })
    .first();
  return row ? toList(row) : null;
}

async function withCounts(db: Knex | Knex.Transaction, rows: RequestListRow[]): Promise<RequestListSummary[]> {
  if (rows.length === 0) return [];
  const counts = await db("request_items")
    .whereIn(
      "request_list_id",
      rows.map((r) => r.id),
    )
    .groupBy("request_list_id", "status")
    .select("request_list_id", "status")
    .count({ n: "*" });
  return rows.map((r) => {
    const c: Record<RequestItemStatus, number> = { requested: 0, provided: 0, accepted: 0, "needs-more": 0 };
    for (const x of counts) if (Number(x.request_list_id) === r.id) c[x.status] = Number(x.n);
    return { ...r, counts: c, total: Object.values(c).reduce((a, b) => a + b, 0) };
  });
}

export async function listRequestListsBySampleId(db: Knex | Knex.Transaction, { sampleId }: { sampleId: number }) {
  return withCounts(db, (await listQuery(db).where("l.sample_id", sampleId).orderBy("l.id", "desc")).map(toList));
}

export async function listRequestListsByContactId(
  db: Knex | Knex.Transaction,
  { contactUserId }: { contactUserId: number },
) {
  const rows = await listQuery(db)
    .join("engagement_members as m", (j) =>
      j.on("m.engagement_id", "l.engagement_id").andOn("m.user_id", "l.contact_user_id"),
    )
    .where({ "l.contact_user_id": contactUserId, "m.role": "client" })
    .orderBy("l.due_date")
    .orderBy("l.id");
  return withCounts(db, rows.map(toList));
}

export async function insertRequestList(
  trx: Knex.Transaction,
  a: {
    engagementId: number;
    sampleId: number;
    title: string;
    message: string | null;
    contactUserId: number;
    dueDate: string;
    showBookValues: boolean;
    createdBy: number;
  },
): Promise<number> {
  const [id] = await trx("request_lists").insert({
    engagement_id: a.engagementId,
    sample_id: a.sampleId,
    title: a.title,
    message: a.message,
    contact_user_id: a.contactUserId,
    due_date: a.dueDate,
    show_book_values: a.showBookValues,
    created_by: a.createdBy,
  });
  return Number(id);
}

/** The list's status, under a row lock to the end of the transaction (a missing list is a bug). */
export async function lockRequestListById(trx: Knex.Transaction, { listId }: { listId: number }) {
  return mustExist(
    await trx("request_lists").where({ id: listId }).forUpdate().first("status", "closed_reason"),
    `request list ${listId}`,
  );
}

/** The sample's open lists, under a row lock to the end of the transaction. */
export async function lockOpenRequestListIdsBySampleId(trx: Knex.Transaction, { sampleId }: { sampleId: number }) {
  const rows = await trx("request_lists").where({ sample_id: sampleId, status: "open" }).forUpdate().select("id");
  return rows.map((r) => Number(r.id));
}

export async function closeRequestListsByIds(
  trx: Knex.Transaction,
  { listIds, reason }: { listIds: number[]; reason: string },
) {
  await trx("request_lists")
    .whereIn("id", listIds)
    .update({ status: "closed", closed_reason: reason, closed_at: trx.fn.now(3) });
}

export interface OverdueRequestItem {
  id: number;
  engagement_id: number;
  sample_id: number;
  title: string;
  due_date: string;
  item_ref: string;
  cid: number;
  cname: string;
  cemail: string;
  sid: number;
  sname: string;
  semail: string;
  sactive: number;
  client_name: string;
  ename: string;
}

/** Items still awaiting the client on open lists past due and not yet reminded `today`, with the list's contact, sender and engagement. */
export async function listOverdueRequestItems(db: Knex | Knex.Transaction, { today }: { today: string }) {
  return db("request_lists as l")
    .join("request_items as r", "r.request_list_id", "l.id")
    .join("sample_items as i", "i.id", "r.sample_item_id")
    .join("users as c", "c.id", "l.contact_user_id")
    .join("users as s", "s.id", "l.created_by")
    .join("engagements as e", "e.id", "l.engagement_id")
    .where("l.status", "open")
    .where("l.due_date", "<", today)
    .whereIn("r.status", ["requested", "needs-more"])
    .where((w) => {
      w.whereNull("l.last_reminded_on").orWhere("l.last_reminded_on", "<", today);
    })
    .where("c.active", true)
    .orderBy("l.id")
    .orderBy("r.position")
    .select<OverdueRequestItem[]>(
      "l.id",
      "l.engagement_id",
      "l.sample_id",
      "l.title",
      "l.due_date",
      "i.item_ref",
      "c.id as cid",
      "c.name as cname",
      "c.email as cemail",
      "s.id as sid",
      "s.name as sname",
      "s.email as semail",
      "s.active as sactive",
      "e.client_name",
      "e.name as ename",
    );
}

/** Marks the list reminded `today`; false when another run already did (so a second run the same day sends nothing). */
export async function markRequestListRemindedById(
  trx: Knex.Transaction,
  { listId, today }: { listId: number; today: string },
) {
  const won = await trx("request_lists")
    .where({ id: listId })
    .where((w) => {
      w.whereNull("last_reminded_on").orWhere("last_reminded_on", "<", today);
    })
    .update({ last_reminded_on: today });
  return won > 0;
}
