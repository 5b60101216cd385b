import "server-only";
import type { Knex } from "knex";
import type { SummaryNote } from "@/lib/misstatements/types";
import type { MisstatementNotesRow } from "./tables";

type NotePatch = Knex.ResolveTableType<Knex.TableType<"misstatement_notes">, "update">;
type NoteRow = MisstatementNotesRow & {
  raised_name: string;
  answered_name: string | null;
  cleared_name: string | null;
};

const iso = (v: Date | null) => (v ? new Date(v).toISOString() : null);

/** The summary's review notes, oldest first, with the names of who raised, answered and cleared them. */
export async function listNotesByEngagementId(
  db: Knex,
  { engagementId }: { engagementId: number },
): Promise<SummaryNote[]> {
  const rows = await db("misstatement_notes as n")
    .join("users as r", "r.id", "n.raised_by")
    .leftJoin("users as a", "a.id", "n.answered_by")
    .leftJoin("users as c", "c.id", "n.cleared_by")
    .where("n.engagement_id", engagementId)
    .orderBy("n.id")
    .select<NoteRow[]>("n.*", "r.name as raised_name", "a.name as answered_name", "c.name as cleared_name");
  return rows.map((r) => ({
    id: r.id,
    text: r.text,
    status: r.status,
    raisedBy: r.raised_name,
    raisedAt: new Date(r.raised_at).toISOString(),
    answer: r.answer ?? null,
    answeredBy: r.answered_name ?? null,
    answeredAt: iso(r.answered_at),
    clearedBy: r.cleared_name ?? null,
    clearedAt: iso(r.cleared_at),
  }));
}

export async function insertMisstatementNote(
  trx: Knex.Transaction,
  { engagementId, text, raisedBy }: { engagementId: number; text: string; raisedBy: number },
): Promise<number> {
  const [id] = await trx("misstatement_notes").insert({ engagement_id: engagementId, text, raised_by: raisedBy });
  return id;
}

/** The note, locked to the end of the transaction; undefined when the engagement has no such note. */
export async function lockNoteById(
  trx: Knex.Transaction,
  { engagementId, noteId }: { engagementId: number; noteId: number },
): Promise<MisstatementNotesRow | undefined> {
  return trx("misstatement_notes").where({ id: noteId, engagement_id: engagementId }).forUpdate().first();
}

export async function updateNoteById(trx: Knex.Transaction, { noteId, patch }: { noteId: number; patch: NotePatch }) {
  await trx("misstatement_notes").where({ id: noteId }).update(patch);
}
