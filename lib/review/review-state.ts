import "server-only";
import type { Knex } from "knex";
import { getAuditorConclusionBySampleId, type AuditorConclusionRecord } from "@/lib/data/auditor-conclusions";

export interface SignOffView {
  name: string;
  role: string;
  at: string;
}
export interface ReviewState {
  preparer: SignOffView | null;
  reviewer: SignOffView | null;
  lock: { name: string; at: string; workpaperSha256: string; workpaperBytes: number; reference: string } | null;
  openNotes: number;
  /** The auditor's conclusion and response (issue 13), written by the preparer; null while none. */
  conclusion: AuditorConclusionRecord | null;
}

export async function getReviewState(db: Knex, { sampleId }: { sampleId: number }): Promise<ReviewState> {
  const [r, notes, conclusion] = await Promise.all([
    db("samples as s")
      .leftJoin("users as p", "p.id", "s.preparer_signed_by")
      .leftJoin("users as v", "v.id", "s.reviewer_signed_by")
      .leftJoin("users as l", "l.id", "s.locked_by")
      .where("s.id", sampleId)
      .first("s.*", "p.name as p_name", "v.name as v_name", "l.name as l_name"),
    db("review_notes").where({ sample_id: sampleId }).whereNot("status", "cleared").count({ n: "*" }).first(),
    getAuditorConclusionBySampleId(db, { sampleId }),
  ]);
  const at = (v: unknown) => new Date(v as string).toISOString();
  return {
    preparer: r.preparer_signed_at
      ? { name: r.p_name, role: r.preparer_signed_role, at: at(r.preparer_signed_at) }
      : null,
    reviewer: r.reviewer_signed_at
      ? { name: r.v_name, role: r.reviewer_signed_role, at: at(r.reviewer_signed_at) }
      : null,
    lock: r.locked_at
      ? {
          name: r.l_name,
          at: at(r.locked_at),
          workpaperSha256: r.workpaper_sha256,
          workpaperBytes: Number(r.workpaper_size_bytes),
          reference: r.workpaper_reference,
        }
      : null,
    openNotes: Number(notes?.n ?? 0),
    conclusion,
  };
}
