import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { conflict, notFound } from "@/lib/errors";
import { assertSummaryUnlocked } from "./guard";
import type { SummaryNote } from "./types";

const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null);

export async function listSummaryNotes(db: Knex, { engagementId }: { engagementId: number }): Promise<SummaryNote[]> {
  const rows = await db("misstatement_notes as n")
    .join("users as r", "r.id", "n.raised_by")
    .leftJoin("users as a", "a.id", "n.answered_by")
    .leftJoin("users as c", "c.id", "n.cleared_by")
    .where("n.engagement_id", engagementId)
    .orderBy("n.id")
    .select("n.*", "r.name as raised_name", "a.name as answered_name", "c.name as cleared_name");
  return rows.map((r) => ({
    id: r.id,
    text: r.text,
    status: r.status,
    raisedBy: r.raised_name,
    raisedAt: iso(r.raised_at)!,
    answer: r.answer ?? null,
    answeredBy: r.answered_name ?? null,
    answeredAt: iso(r.answered_at),
    clearedBy: r.cleared_name ?? null,
    clearedAt: iso(r.cleared_at),
  }));
}

export async function raiseSummaryNote(
  db: Knex,
  { engagementId, actorId, text }: { engagementId: number; actorId: number; text: string },
) {
  return db.transaction(async (trx) => {
    await assertSummaryUnlocked(trx, engagementId);
    const [id] = await trx("misstatement_notes").insert({ engagement_id: engagementId, text, raised_by: actorId });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "misstatement_note",
      entityId: id,
      action: "raise",
      after: { text },
    });
    return id;
  });
}

async function noteFor(trx: Knex.Transaction, engagementId: number, noteId: number) {
  const note = await trx("misstatement_notes").where({ id: noteId, engagement_id: engagementId }).forUpdate().first();
  if (!note) throw notFound("No such review note");
  return note;
}

export async function answerSummaryNote(
  db: Knex,
  { engagementId, actorId, noteId, answer }: { engagementId: number; actorId: number; noteId: number; answer: string },
) {
  await db.transaction(async (trx) => {
    await assertSummaryUnlocked(trx, engagementId);
    const note = await noteFor(trx, engagementId, noteId);
    if (note.status === "cleared") throw conflict("This note is already cleared.");
    await trx("misstatement_notes")
      .where({ id: noteId })
      .update({ status: "answered", answer, answered_by: actorId, answered_at: trx.fn.now(3) });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "misstatement_note",
      entityId: noteId,
      action: "answer",
      before: { status: note.status, answer: note.answer },
      after: { status: "answered", answer },
    });
  });
}

export async function clearSummaryNote(
  db: Knex,
  { engagementId, actorId, noteId }: { engagementId: number; actorId: number; noteId: number },
) {
  await db.transaction(async (trx) => {
    await assertSummaryUnlocked(trx, engagementId);
    const note = await noteFor(trx, engagementId, noteId);
    if (note.status !== "answered")
      throw conflict(
        note.status === "cleared" ? "This note is already cleared." : "The preparer has not answered this note yet.",
      );
    await trx("misstatement_notes")
      .where({ id: noteId })
      .update({ status: "cleared", cleared_by: actorId, cleared_at: trx.fn.now(3) });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "misstatement_note",
      entityId: noteId,
      action: "clear",
      before: { status: "answered" },
      after: { status: "cleared" },
    });
  });
}
