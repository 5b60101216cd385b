import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "./audit-log";
import type { SampleRecord } from "./samples";
import type { ReviewNotesRow } from "./tables";
import { conflict, notFound } from "@/lib/errors";
import { assertSampleUnlocked } from "@/lib/samples/guard";
import { mustExist } from "./must-exist";

export interface ReviewNote {
  id: number;
  itemId: number | null;
  itemRef: string | null;
  text: string;
  status: "open" | "answered" | "cleared";
  raisedBy: string;
  raisedById: number;
  raisedAt: string;
  answer: string | null;
  answeredBy: string | null;
  answeredAt: string | null;
  clearedBy: string | null;
  clearedAt: string | null;
}

const iso = (v: Date | null) => (v ? new Date(v).toISOString() : null);

type NoteRow = ReviewNotesRow & {
  item_ref: string | null;
  raised_name: string;
  answered_name: string | null;
  cleared_name: string | null;
};

export async function listNotesBySampleId(db: Knex, { sampleId }: { sampleId: number }): Promise<ReviewNote[]> {
  const rows = await db("review_notes as n")
    .leftJoin("sample_items as i", "i.id", "n.sample_item_id")
    .join("users as r", "r.id", "n.raised_by")
    .leftJoin("users as a", "a.id", "n.answered_by")
    .leftJoin("users as c", "c.id", "n.cleared_by")
    .where("n.sample_id", sampleId)
    .orderBy("n.id")
    .select<NoteRow[]>(
      "n.*",
      "i.item_ref",
      "r.name as raised_name",
      "a.name as answered_name",
      "c.name as cleared_name",
    );
  return rows.map((r) => ({
    id: r.id,
    itemId: r.sample_item_id,
    itemRef: r.item_ref ?? null,
    text: r.text,
    status: r.status,
    raisedBy: r.raised_name,
    raisedById: r.raised_by,
    raisedAt: new Date(r.raised_at).toISOString(),
    answer: r.answer,
    answeredBy: r.answered_name ?? null,
    answeredAt: iso(r.answered_at),
    clearedBy: r.cleared_name ?? null,
    clearedAt: iso(r.cleared_at),
  }));
}

/** Notes of the sample not yet cleared (open or answered): the reviewer cannot sign off while any remain. */
export async function countOpenNotesBySampleId(db: Knex | Knex.Transaction, { sampleId }: { sampleId: number }) {
  const row = await db("review_notes")
    .where({ sample_id: sampleId })
    .whereNot("status", "cleared")
    .count({ n: "*" })
    .first();
  return Number(row?.n ?? 0);
}

/** A note's text and answer, with who raised it (the person told of an answer). */
export async function getNoteWithRaiserById(db: Knex | Knex.Transaction, { noteId }: { noteId: number }) {
  const row = await db("review_notes as n")
    .join("users as r", "r.id", "n.raised_by")
    .where("n.id", noteId)
    .first("n.text", "n.answer", "r.name", "r.email");
  return mustExist(row, `review note ${noteId}`);
}

export async function raiseNote(
  db: Knex,
  { sample, actorId, text, itemId }: { sample: SampleRecord; actorId: number; text: string; itemId?: number },
) {
  return db.transaction(async (trx) => {
    await assertSampleUnlocked(trx, sample.id);
    if (itemId !== undefined && !(await trx("sample_items").where({ id: itemId, sample_id: sample.id }).first("id")))
      throw notFound("No such item in this sample");
    const [id] = await trx("review_notes").insert({
      sample_id: sample.id,
      sample_item_id: itemId ?? null,
      text,
      raised_by: actorId,
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "review_note",
      entityId: id,
      action: "raise",
      after: { text, itemId: itemId ?? null },
    });
    return id;
  });
}

export async function answerNote(
  db: Knex,
  { sample, actorId, noteId, answer }: { sample: SampleRecord; actorId: number; noteId: number; answer: string },
) {
  await db.transaction(async (trx) => {
    await assertSampleUnlocked(trx, sample.id);
    const note = await trx("review_notes").where({ id: noteId, sample_id: sample.id }).forUpdate().first();
    if (!note) throw notFound("No such review note");
    if (note.status === "cleared") throw conflict("This note is already cleared.");
    await trx("review_notes")
      .where({ id: noteId })
      .update({ status: "answered", answer, answered_by: actorId, answered_at: trx.fn.now(3) });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "review_note",
      entityId: noteId,
      action: "answer",
      before: { status: note.status, answer: note.answer },
      after: { status: "answered", answer },
    });
  });
}

export async function clearNote(
  db: Knex,
  { sample, actorId, noteId }: { sample: SampleRecord; actorId: number; noteId: number },
) {
  await db.transaction(async (trx) => {
    await assertSampleUnlocked(trx, sample.id);
    const note = await trx("review_notes").where({ id: noteId, sample_id: sample.id }).forUpdate().first();
    if (!note) throw notFound("No such review note");
    if (note.status !== "answered")
      throw conflict(
        note.status === "cleared" ? "This note is already cleared." : "The preparer has not answered this note yet.",
      );
    await trx("review_notes")
      .where({ id: noteId })
      .update({ status: "cleared", cleared_by: actorId, cleared_at: trx.fn.now(3) });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "review_note",
      entityId: noteId,
      action: "clear",
      before: { status: "answered" },
      after: { status: "cleared" },
    });
  });
}
