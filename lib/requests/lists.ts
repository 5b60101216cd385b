import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { getCurrentDraw, type SampleRecord } from "@/lib/data/samples";
import { AppError, conflict, fieldError, notFound } from "@/lib/errors";
import { assertSampleUnlocked } from "@/lib/samples/guard";
import type { CreateRequestList, RequestItemStatus, RequestNeed } from "@/lib/validation/requests";
import { utcDay } from "./status";

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

const iso = (v: unknown) => new Date(v as string).toISOString();

function toList(r: Record<string, unknown>): RequestListRow {
  return {
    id: Number(r.id),
    engagementId: Number(r.engagement_id),
    sampleId: Number(r.sample_id),
    title: String(r.title),
    message: (r.message as string | null) ?? null,
    contactUserId: Number(r.contact_user_id),
    contactName: String(r.contact_name),
    contactEmail: String(r.contact_email),
    dueDate: String(r.due_date),
    showBookValues: Boolean(r.show_book_values),
    status: r.status as RequestListRow["status"],
    closedReason: (r.closed_reason as string | null) ?? null,
    createdById: Number(r.created_by),
    createdByName: String(r.created_by_name),
    createdAt: iso(r.created_at),
  };
}

const listQuery = (db: Knex) =>
  db("request_lists as l")
    .join("users as c", "c.id", "l.contact_user_id")
    .join("users as b", "b.id", "l.created_by")
    .select("l.*", "c.name as contact_name", "c.email as contact_email", "b.name as created_by_name");

/** A list the audit team sees: on this engagement and sample (404 otherwise). */
export async function getRequestListRow(
  db: Knex,
  { engagementId, sampleId, listId }: { engagementId: number; sampleId: number; listId: number },
) {
  const row = await listQuery(db)
    .where({ "l.id": listId, "l.engagement_id": engagementId, "l.sample_id": sampleId })
    .first();
  if (!row) throw notFound("No such request list");
  return toList(row);
}

/** A list as its client contact reaches it: addressed to them, and they are still a client contact on its engagement; null otherwise. */
export async function getRequestListRowForContact(
  db: Knex,
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

async function withCounts(db: Knex, rows: RequestListRow[]): Promise<RequestListSummary[]> {
  if (rows.length === 0) return [];
  const counts = (await db("request_items")
    .whereIn(
      "request_list_id",
      rows.map((r) => r.id),
    )
    .groupBy("request_list_id", "status")
    .select("request_list_id", "status")
    .count({ n: "*" })) as unknown as { request_list_id: number; status: string; n: number }[];
  return rows.map((r) => {
    const c: Record<RequestItemStatus, number> = { requested: 0, provided: 0, accepted: 0, "needs-more": 0 };
    for (const x of counts) if (Number(x.request_list_id) === r.id) c[x.status as RequestItemStatus] = Number(x.n);
    return { ...r, counts: c, total: Object.values(c).reduce((a, b) => a + b, 0) };
  });
}

export async function listRequestListsBySampleId(db: Knex, { sampleId }: { sampleId: number }) {
  return withCounts(db, (await listQuery(db).where("l.sample_id", sampleId).orderBy("l.id", "desc")).map(toList));
}

export async function listRequestListsByContactId(db: Knex, { contactUserId }: { contactUserId: number }) {
  const rows = await listQuery(db)
    .join("engagement_members as m", (j) =>
      j.on("m.engagement_id", "l.engagement_id").andOn("m.user_id", "l.contact_user_id"),
    )
    .where({ "l.contact_user_id": contactUserId, "m.role": "client" })
    .orderBy("l.due_date")
    .orderBy("l.id");
  return withCounts(db, rows.map(toList));
}

/**
 * Creates a request list from the sample's current draw: the chosen items (or all that are not
 * void), each asking for the same things, addressed to a client contact of the engagement.
 * Refused when the sample is locked (409), not drawn (409), or the contact or an item is not valid (400 naming it).
 */
export async function createRequestList(
  db: Knex,
  { sample, actorId, input }: { sample: SampleRecord; actorId: number; input: CreateRequestList },
) {
  if (input.dueDate < utcDay())
    throw fieldError("dueDate", "the due date is in the past", "The due date is in the past");
  return db.transaction(async (trx) => {
    await assertSampleUnlocked(trx, sample.id);
    const draw = await getCurrentDraw(trx, { sampleId: sample.id });
    if (!draw) throw conflict("Draw the sample before asking the client for evidence on its items.");
    const contact = await trx("engagement_members")
      .where({ engagement_id: sample.engagementId, user_id: input.contactUserId, role: "client" })
      .first("user_id");
    if (!contact)
      throw fieldError(
        "contactUserId",
        "that person is not a client contact of this engagement",
        "Not a client contact of this engagement: invite them first",
      );
    const drawn = await trx("sample_items")
      .where({ draw_id: draw.id })
      .whereNot({ status: "void" })
      .orderBy("selection_order")
      .orderBy("id")
      .select("id");
    const drawnIds = drawn.map((r) => Number(r.id));
    const chosen = input.items === "all" ? drawnIds : [...new Set(input.items)];
    const stray = chosen.filter((id) => !drawnIds.includes(id));
    if (stray.length)
      throw fieldError(
        "items",
        `item ${stray[0]} is not a live item of this sample's current draw`,
        `Item ${stray[0]} is not a live item of this sample`,
      );
    const ordered = drawnIds.filter((id) => chosen.includes(id));
    const [listId] = await trx("request_lists").insert({
      engagement_id: sample.engagementId,
      sample_id: sample.id,
      title: input.title,
      message: input.message ?? null,
      contact_user_id: input.contactUserId,
      due_date: input.dueDate,
      show_book_values: input.showBookValues,
      created_by: actorId,
    });
    const needs = JSON.stringify(input.needs satisfies RequestNeed[]);
    await trx("request_items").insert(
      ordered.map((sampleItemId, i) => ({
        request_list_id: listId,
        sample_item_id: sampleItemId,
        position: i + 1,
        needs_json: needs,
        needs_note: input.needsNote ?? null,
      })),
    );
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "request_list",
      entityId: listId,
      action: "create",
      after: {
        title: input.title,
        contactUserId: input.contactUserId,
        dueDate: input.dueDate,
        showBookValues: input.showBookValues,
        items: ordered.length,
        needs: input.needs,
        needsNote: input.needsNote ?? null,
      },
    });
    return listId;
  });
}

/** A locked sample closes its open request lists (inside the lock's transaction); each closing is in the audit log. */
/** Closes the sample's open request lists; returns the ids it closed (their contacts are told after the commit). */
export async function closeRequestListsOfSample(
  trx: Knex.Transaction,
  {
    sampleId,
    engagementId,
    actorId,
    reason,
  }: { sampleId: number; engagementId: number; actorId: number; reason: string },
): Promise<number[]> {
  const open = await trx("request_lists").where({ sample_id: sampleId, status: "open" }).forUpdate().select("id");
  if (open.length === 0) return [];
  await trx("request_lists")
    .whereIn(
      "id",
      open.map((r) => r.id),
    )
    .update({ status: "closed", closed_reason: reason, closed_at: trx.fn.now(3) });
  for (const { id } of open) {
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      sampleId,
      entity: "request_list",
      entityId: id,
      action: "close",
      before: { status: "open" },
      after: { status: "closed", reason },
    });
  }
  return open.map((r) => Number(r.id));
}

export const CLOSED_BY_LOCK = "The sample was locked: its workpaper is final.";

/** The message a client gets when writing to a closed list. */
export function closedListError(list: Pick<RequestListRow, "closedReason">) {
  return new AppError(
    409,
    "request_list_closed",
    `This request list is closed${list.closedReason ? ` (${list.closedReason.replace(/\.$/, "")})` : ""}: the audit team no longer takes files on it. Contact them if you have more to send.`,
  );
}
