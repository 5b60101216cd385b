import "server-only";
import type { Knex } from "knex";
import { getAuditorConclusionBySampleId, type AuditorConclusionRecord } from "@/lib/data/auditor-conclusions";
import { countOpenNotesBySampleId } from "@/lib/data/review-notes";
import { getSampleReviewById } from "@/lib/data/sample-review";

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

const at = (v: Date | string) => new Date(v).toISOString();

export async function getReviewState(db: Knex, { sampleId }: { sampleId: number }): Promise<ReviewState> {
  const [r, openNotes, conclusion] = await Promise.all([
    getSampleReviewById(db, { sampleId }),
    countOpenNotesBySampleId(db, { sampleId }),
    getAuditorConclusionBySampleId(db, { sampleId }),
  ]);
  return {
    preparer: r.preparer_signed_at
      ? { name: r.preparerName ?? "", role: r.preparer_signed_role ?? "", at: at(r.preparer_signed_at) }
      : null,
    reviewer: r.reviewer_signed_at
      ? { name: r.reviewerName ?? "", role: r.reviewer_signed_role ?? "", at: at(r.reviewer_signed_at) }
      : null,
    lock: r.locked_at
      ? {
          name: r.lockedByName ?? "",
          at: at(r.locked_at),
          workpaperSha256: r.workpaper_sha256 ?? "",
          workpaperBytes: Number(r.workpaper_size_bytes),
          reference: r.workpaper_reference ?? "",
        }
      : null,
    openNotes,
    conclusion,
  };
}
