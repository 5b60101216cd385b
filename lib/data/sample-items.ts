import "server-only";
import type { Knex } from "knex";
import type { SaveResult } from "@/lib/validation/sample";
import { z } from "zod";
import { recordAudit } from "./audit-log";
import { parseJsonColumn } from "./json-column";
import type { SampleItemsRow } from "./tables";
import { containsPattern } from "./like";
import { seekFromQuery, seekPage } from "./keyset";
import { transactionWithRetry } from "./transaction-retry";
import type { Cursor, KeysetPage } from "@/lib/validation/keyset";
import { beginResultWrite } from "@/lib/samples/guard";
import { ANOMALY_CLEARED } from "@/lib/samples/anomalies";
import { AppError, notFound } from "@/lib/errors";
import { itemMisstatement } from "@/lib/samples/item-misstatement";
import type { TestDirection } from "@/lib/sampling";
import { formatDateTime } from "@/lib/format/date";

export interface SampleItemRecord {
  id: number;
  selectionOrder: number;
  populationRowNumber: number;
  itemRef: string;
  description: string | null;
  bookValue: string;
  hitPoints: number[] | null;
  topStratum: boolean;
  stratum: number | null;
  origin: "selection" | "extension" | "replacement" | "key-item" | "haphazard";
  /** Examined 100 % (threshold or chosen with a reason); evaluated at its actual misstatement. */
  keyItem: boolean;
  keyReason: string | null;
  /** Haphazard picks: who picked the item and when. */
  pickedByName: string | null;
  pickedAt: string | null;
  /** An anomalous misstatement: the justification, who marked it, and the manager's or partner's acceptance. */
  anomaly: {
    justification: string;
    markedByName: string | null;
    markedAt: string | null;
    acceptedByName: string | null;
    acceptedAt: string | null;
  } | null;
  replacesItemId: number | null;
  status: "not-started" | "done" | "not-auditable" | "void";
  auditedValue: string | null;
  /** Book minus audited (overstatement positive); an unauditable item counts in full in the sample's tested direction (lib/samples/item-misstatement.ts). */
  misstatement: string | null;
  cause: string | null;
  causeNote: string | null;
  deviation: boolean | null;
  deviationNature: string | null;
  comment: string | null;
  voidReason: string | null;
  evidenceCount: number;
  /** The item's status on the newest client request list that asks for it, or null when none does. */
  requestStatus: "requested" | "provided" | "accepted" | "needs-more" | null;
  version: number;
  updatedAt: string | null;
  updatedByName: string | null;
}

const HitPointsSchema = z.array(z.number()).nullable();

/** sample_items.hit_points read back: the MUS hit points of the item, or null for other selections. */
const parseHitPoints = (v: unknown, itemId: number) =>
  parseJsonColumn(HitPointsSchema, v ?? null, "sample_items.hit_points", itemId);

function toItem(r: Record<string, unknown>): SampleItemRecord {
  const points = parseHitPoints(r.hit_points, Number(r.id));
  const audited = r.audited_value === null ? null : String(r.audited_value);
  return {
    id: Number(r.id),
    selectionOrder: Number(r.selection_order),
    populationRowNumber: Number(r.population_row_number),
    itemRef: String(r.item_ref),
    description: (r.description as string | null) ?? null,
    bookValue: String(r.book_value),
    hitPoints: points,
    topStratum: Boolean(r.top_stratum),
    stratum: r.stratum === null ? null : Number(r.stratum),
    origin: r.origin as SampleItemRecord["origin"],
    replacesItemId: r.replaces_item_id === null ? null : Number(r.replaces_item_id),
    status: r.status as SampleItemRecord["status"],
    auditedValue: audited,
    misstatement: itemMisstatement(
      String(r.status),
      String(r.book_value),
      audited,
      (r.sample_direction as TestDirection | null) ?? "overstatement",
    ),
    cause: (r.cause as string | null) ?? null,
    causeNote: (r.cause_note as string | null) ?? null,
    deviation: r.deviation === null ? null : Boolean(r.deviation),
    deviationNature: (r.deviation_nature as string | null) ?? null,
    comment: (r.comment as string | null) ?? null,
    voidReason: (r.void_reason as string | null) ?? null,
    keyItem: Boolean(r.key_item),
    keyReason: (r.key_reason as string | null) ?? null,
    pickedByName: (r.picked_by_name as string | null) ?? null,
    pickedAt: r.picked_at ? new Date(r.picked_at as string).toISOString() : null,
    anomaly: r.anomaly_justification
      ? {
          justification: String(r.anomaly_justification),
          markedByName: (r.anomaly_marked_by_name as string | null) ?? null,
          markedAt: r.anomaly_marked_at ? new Date(r.anomaly_marked_at as string).toISOString() : null,
          acceptedByName: (r.anomaly_accepted_by_name as string | null) ?? null,
          acceptedAt: r.anomaly_accepted_at ? new Date(r.anomaly_accepted_at as string).toISOString() : null,
        }
      : null,
    evidenceCount: Number(r.evidence_count ?? 0),
    requestStatus: (r.request_status as SampleItemRecord["requestStatus"]) ?? null,
    version: Number(r.version),
    updatedAt: r.updated_at ? new Date(r.updated_at as string).toISOString() : null,
    updatedByName: (r.updated_by_name as string | null) ?? null,
  };
}

/** Files attached to the item and not deleted (item_evidence). */
const evidenceCount = (db: Knex) =>
  db.raw(
    "(select count(*) from item_evidence e where e.sample_item_id = i.id and e.deleted_at is null) as evidence_count",
  );

/** The direction the item's sample tests, which says how an item that could not be audited counts (samples). */
const sampleDirection = (db: Knex) =>
  db.raw("(select s.direction from samples s where s.id = i.sample_id) as sample_direction");

/** Names of the people behind a pick and an anomaly mark (users). */
const peopleNames = (db: Knex) => [
  db.raw("(select p.name from users p where p.id = i.picked_by) as picked_by_name"),
  db.raw("(select m.name from users m where m.id = i.anomaly_marked_by) as anomaly_marked_by_name"),
  db.raw("(select a.name from users a where a.id = i.anomaly_accepted_by) as anomaly_accepted_by_name"),
];

/** The newest request on the item (request_items). */
const requestStatus = (db: Knex) =>
  db.raw(
    "(select r.status from request_items r where r.sample_item_id = i.id order by r.id desc limit 1) as request_status",
  );

function itemQuery(db: Knex, drawId: number) {
  const q = db("sample_items as i")
    .leftJoin("users as u", "u.id", "i.updated_by")
    .where("i.draw_id", drawId)
    .select(
      "i.*",
      "u.name as updated_by_name",
      evidenceCount(db),
      requestStatus(db),
      sampleDirection(db),
      ...peopleNames(db),
    );
  return q;
}

interface ItemsPageQuery {
  page?: number;
  pageSize?: number;
  status?: string;
  q?: string;
  after?: Cursor;
  before?: Cursor;
  last?: boolean;
}

/** A draw's items in selection order, filtered, paged by key (selection order plus id); without paging, all of them. */
export async function listItemsByDrawId(
  db: Knex,
  { drawId, page = 1, pageSize = 100000, status = "all", q, after, before, last }: { drawId: number } & ItemsPageQuery,
): Promise<KeysetPage<SampleItemRecord>> {
  const base = db("sample_items as i").where("i.draw_id", drawId);
  if (status !== "all") base.andWhere("i.status", status);
  if (q)
    base.andWhere((w) => {
      w.where("i.item_ref", "like", containsPattern(q)).orWhere("i.description", "like", containsPattern(q));
    });
  const total = Number((await base.clone().count({ n: "*" }).first())?.n ?? 0);
  const rows = base
    .clone()
    .leftJoin("users as u", "u.id", "i.updated_by")
    .select(
      "i.*",
      "u.name as updated_by_name",
      evidenceCount(db),
      requestStatus(db),
      sampleDirection(db),
      ...peopleNames(db),
    );
  const from = seekFromQuery({ after, before, last: last ?? false, page, pageSize }, total);
  const seek = await seekPage<Record<string, unknown>>(
    rows,
    { column: "i.selection_order", key: "i.id", dir: "asc" },
    from,
    pageSize,
    (r) => ({ value: Number(r.selection_order), key: Number(r.id) }),
  );
  const pageNumber = last ? Math.max(1, Math.ceil(total / pageSize)) : page;
  return {
    items: seek.rows.map(toItem),
    total,
    page: pageNumber,
    pageSize,
    nextCursor: seek.nextCursor,
    prevCursor: seek.prevCursor,
  };
}

export async function getItemById(db: Knex, { drawId, itemId }: { drawId: number; itemId: number }) {
  const row = await itemQuery(db, drawId).andWhere("i.id", itemId).first();
  if (!row) throw notFound("No such item in this sample");
  return toItem(row);
}

/** Every item of the sample, in any draw, by id: what the audit trail names items with. */
export async function listItemRefsBySampleId(db: Knex | Knex.Transaction, { sampleId }: { sampleId: number }) {
  return db("sample_items").where({ sample_id: sampleId }).select("id", "item_ref");
}

/** The evidence files of the sample's items (any draw), with their item's reference. */
export async function listEvidenceNamesBySampleId(db: Knex | Knex.Transaction, { sampleId }: { sampleId: number }) {
  return db("item_evidence as e")
    .join("sample_items as i", "i.id", "e.sample_item_id")
    .where("i.sample_id", sampleId)
    .select("e.id", "e.file_name", "i.item_ref");
}

/** The draw's items that are not void, in selection order. */
export async function listLiveItemIdsByDrawId(db: Knex | Knex.Transaction, { drawId }: { drawId: number }) {
  const rows = await db("sample_items")
    .where({ draw_id: drawId })
    .whereNot({ status: "void" })
    .orderBy("selection_order")
    .orderBy("id")
    .select("id");
  return rows.map((r) => Number(r.id));
}

/** How many items of a draw have this status. */
export async function countItemsByDrawId(
  db: Knex | Knex.Transaction,
  { drawId, status }: { drawId: number; status: SampleItemRecord["status"] },
): Promise<number> {
  const row = await db("sample_items").where({ draw_id: drawId, status }).count({ n: "*" }).first();
  return Number(row?.n ?? 0);
}

type ResultWrite = {
  engagementId: number;
  sampleId: number;
  drawId: number;
  itemId: number;
  actorId: number;
  input: SaveResult;
};

/**
 * Writes one item's result inside the caller's transaction (after `beginResultWrite`), if nobody
 * changed it since the caller read it (optimistic concurrency): a stale version gets 409 naming who
 * changed it and when, and nothing is overwritten. One audit row per item.
 */
export async function applyItemResult(
  trx: Knex.Transaction,
  { engagementId, sampleId, drawId, itemId, actorId, input }: ResultWrite,
): Promise<SampleItemRecord> {
  const before = await itemQuery(trx, drawId).andWhere("i.id", itemId).forUpdate().first();
  if (!before) throw notFound("No such item in this sample");
  if (before.status === "void")
    throw new AppError(409, "void_item", "This item was voided and replaced; record the result on its replacement.");
  if (Number(before.version) !== input.version) {
    const when = before.updated_at ? `on ${formatDateTime(new Date(before.updated_at))}` : "recently";
    throw new AppError(
      409,
      "stale",
      `${before.updated_by_name ?? "Someone"} changed this item ${when}, after you opened it. Reload to see their change; yours was not saved.`,
      undefined,
    );
  }
  const patch = {
    status: input.status,
    audited_value: input.status === "not-auditable" ? null : (input.auditedValue ?? null),
    cause: input.cause ?? null,
    cause_note: input.causeNote ?? null,
    deviation: input.deviation ?? null,
    deviation_nature: input.deviationNature ?? null,
    comment: input.comment ?? null,
    version: input.version + 1,
    updated_by: actorId,
    updated_at: trx.fn.now(3),
  };
  // A later change of the result clears an anomaly mark and its acceptance (they judged the earlier figures).
  const amountText = (v: unknown) => (v === null || v === undefined ? "" : Number(v).toFixed(2));
  const resultChanged =
    before.status !== input.status || amountText(before.audited_value) !== amountText(patch.audited_value);
  const anomalyCleared = Boolean(before.anomaly_justification) && resultChanged;
  await trx("sample_items")
    .where({ id: itemId })
    .update(anomalyCleared ? { ...patch, ...ANOMALY_CLEARED } : patch);
  const after = await getItemById(trx, { drawId, itemId });
  const view = (i: SampleItemRecord) => ({
    status: i.status,
    auditedValue: i.auditedValue,
    cause: i.cause,
    deviation: i.deviation,
    comment: i.comment,
  });
  await recordAudit(trx, {
    actorUserId: actorId,
    engagementId,
    sampleId,
    entity: "sample_item",
    entityId: itemId,
    action: "record-result",
    before: view(toItem(before)),
    after: anomalyCleared ? { ...view(after), anomalyCleared: true } : view(after),
  });
  return after;
}

/** Saves one item's result in its own transaction (see applyItemResult). */
export async function saveItemResult(db: Knex, write: ResultWrite) {
  // A deadlock (or a Galera certification conflict) re-runs the whole save, version check included.
  return transactionWithRetry(db, async (trx) => {
    const signOffsCleared = await beginResultWrite(trx, {
      sampleId: write.sampleId,
      actorId: write.actorId,
      what: "an item's result",
    });
    const item = await applyItemResult(trx, write);
    // samples.updated_at is not touched here: that would take the sample row exclusively and queue every save behind every other.
    return { item, signOffsCleared };
  });
}

type SampleItemPatch = Knex.ResolveTableType<Knex.TableType<"sample_items">, "update">;

/** One item of a draw as stored, optionally under a row lock to the end of the transaction (and only if it belongs to the sample, when given). */
export async function getSampleItemRowById(
  db: Knex | Knex.Transaction,
  { drawId, itemId, sampleId, lock }: { drawId: number; itemId: number; sampleId?: number; lock?: boolean },
): Promise<SampleItemsRow | undefined> {
  const q = db("sample_items").where({ id: itemId, draw_id: drawId });
  if (sampleId !== undefined) q.andWhere({ sample_id: sampleId });
  if (lock) q.forUpdate();
  return q.first();
}

/** Whether the item belongs to the sample (in any draw). */
export async function hasSampleItemById(db: Knex, { sampleId, itemId }: { sampleId: number; itemId: number }) {
  return Boolean(await db("sample_items").where({ id: itemId, sample_id: sampleId }).first("id"));
}

/** The draw's item on a population row, if it is in the sample. */
export async function getSampleItemByRowNumber(
  db: Knex | Knex.Transaction,
  { drawId, rowNumber }: { drawId: number; rowNumber: number },
): Promise<Pick<SampleItemsRow, "id" | "key_item"> | undefined> {
  return db("sample_items").where({ draw_id: drawId, population_row_number: rowNumber }).first("id", "key_item");
}

/** The population rows already in the draw. */
export async function listRowNumbersByDrawId(db: Knex | Knex.Transaction, { drawId }: { drawId: number }) {
  return db("sample_items").where({ draw_id: drawId }).pluck("population_row_number");
}

/** The draw's items that are not key items and not void (haphazard picks count against the plan's size). */
export async function countPickedItemsByDrawId(db: Knex | Knex.Transaction, { drawId }: { drawId: number }) {
  const row = await db("sample_items")
    .where({ draw_id: drawId, key_item: false })
    .whereNot({ status: "void" })
    .count({ n: "*" })
    .first();
  return Number(row?.n ?? 0);
}

/** The highest selection order in the draw (0 when empty). */
export async function getMaxSelectionOrderByDrawId(db: Knex | Knex.Transaction, { drawId }: { drawId: number }) {
  const row = await db("sample_items").where({ draw_id: drawId }).max({ m: "selection_order" }).first();
  return Number(row?.m ?? 0);
}

/** Status, deviation and origin of the draw's items that are not void. */
export async function listItemStatesByDrawId(
  db: Knex | Knex.Transaction,
  { drawId }: { drawId: number },
): Promise<Pick<SampleItemsRow, "status" | "deviation" | "origin">[]> {
  return db("sample_items")
    .where({ draw_id: drawId })
    .whereNot("status", "void")
    .select("status", "deviation", "origin");
}

/** The draw's seeded items (haphazard picks left out) in selection order, with their hit points. */
export async function listSeededItemsByDrawId(db: Knex, { drawId }: { drawId: number }) {
  const rows = await db("sample_items")
    .where({ draw_id: drawId })
    .whereNot({ origin: "haphazard" })
    .orderBy("selection_order")
    .select("id", "population_row_number", "selection_order", "hit_points", "stratum");
  return rows.map((r) => ({
    populationRowNumber: r.population_row_number,
    selectionOrder: r.selection_order,
    hitPoints: parseHitPoints(r.hit_points, r.id),
    stratum: r.stratum,
  }));
}

/** Locks the draw's item rows to the end of the transaction (a whole-workbook import writes them all). */
export async function lockItemsByDrawId(trx: Knex.Transaction, { drawId }: { drawId: number }) {
  await trx("sample_items").where({ draw_id: drawId }).forUpdate().select("id");
}

/** The item references of the given items of the draw, by id (ids not in the draw are left out). */
export async function listItemRefsByIds(db: Knex, { drawId, itemIds }: { drawId: number; itemIds: number[] }) {
  const rows = await db("sample_items").where({ draw_id: drawId }).whereIn("id", itemIds).select("id", "item_ref");
  return new Map(rows.map((r) => [r.id, r.item_ref]));
}

export async function updateSampleItemById(
  trx: Knex.Transaction,
  { itemId, patch }: { itemId: number; patch: SampleItemPatch },
) {
  await trx("sample_items").where({ id: itemId }).update(patch);
}

/** Whether anything hangs on the item: evidence files (even deleted ones) or a client request. */
export async function isSampleItemReferencedById(trx: Knex.Transaction, { itemId }: { itemId: number }) {
  const evidence = await trx("item_evidence").where({ sample_item_id: itemId }).count({ n: "*" }).first();
  if (Number(evidence?.n ?? 0) > 0) return true;
  return Boolean(await trx("request_items").where({ sample_item_id: itemId }).first("id"));
}

export async function deleteSampleItemById(trx: Knex.Transaction, { itemId }: { itemId: number }) {
  await trx("sample_items").where({ id: itemId }).delete();
}

/** A selected item as the draw writes it (its description copied from the population). */
export interface NewSampleItem {
  selectionOrder: number;
  populationRowNumber: number;
  itemRef: string;
  description: string | null;
  bookValue: string;
  hitPoints: number[] | null;
  topStratum: boolean;
  stratum: number | null;
  origin: SampleItemRecord["origin"];
  replacesItemId: number | null;
  keyItem: boolean;
  keyReason: string | null;
  pickedBy?: number;
}

/** Inserts one batch of a draw's items (the caller batches: about 1000 a statement). */
export async function insertSampleItems(
  trx: Knex.Transaction,
  { sampleId, drawId, items }: { sampleId: number; drawId: number; items: NewSampleItem[] },
) {
  await trx("sample_items").insert(
    items.map((it) => ({
      sample_id: sampleId,
      draw_id: drawId,
      selection_order: it.selectionOrder,
      population_row_number: it.populationRowNumber,
      item_ref: it.itemRef,
      description: it.description,
      book_value: it.bookValue,
      hit_points: it.hitPoints ? JSON.stringify(it.hitPoints) : null,
      top_stratum: it.topStratum,
      stratum: it.stratum,
      origin: it.origin,
      replaces_item_id: it.replacesItemId,
      key_item: it.keyItem,
      key_reason: it.keyReason,
      ...(it.pickedBy !== undefined ? { picked_by: it.pickedBy, picked_at: trx.fn.now(3) } : {}),
    })),
  );
}
