import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { conflict, notFound } from "@/lib/errors";
import { assertSummaryUnlocked } from "./guard";
import {
  insertMisstatementNote,
  listNotesByEngagementId,
  lockNoteById,
  updateNoteById,
} from "@/lib/data/misstatement-notes";

/** The summary's review notes, oldest first. */
export const listSummaryNotes = listNotesByEngagementId;

export async function raiseSummaryNote(
  db: Knex,
  { engagementId, actorId, text }: { engagementId: number; actorId: number; text: string },
) {
  return db.transaction(async (trx) => {
    await assertSummaryUnlocked(trx, engagementId);
    const id = await insertMisstatementNote(trx, { engagementId, text, raisedBy: actorId });
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
  const note = await lockNoteById(trx, { engagementId, noteId });
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
    await updateNoteById(trx, {
      noteId,
      patch: { status: "answered", answer, answered_by: actorId, answered_at: trx.fn.now(3) },
    });
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
    await updateNoteById(trx, {
      noteId,
      patch: { status: "cleared", cleared_by: actorId, cleared_at: trx.fn.now(3) },
    });
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
