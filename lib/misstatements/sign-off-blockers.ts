/**
 * Why a sign-off of the summary of misstatements cannot be given now, in the words the page prints
 * beside the disabled button and the server answers with its 409 (lib/misstatements/review.ts).
 * Pure (no I/O), like lib/review/sign-off-blockers.ts for samples, so the page never offers what the
 * server would refuse.
 */
import { countOf } from "@/lib/format/number";

export interface SummaryReviewerFacts {
  /** A preparer's sign-off is on record (whether or not the rows have moved since). */
  preparerSigned: boolean;
  /** The rows differ from the ones the preparer signed for (a sample's results moved). */
  rowsChanged: boolean;
  openNotes: number;
}

export interface SummarySignOffBlocker {
  code: "preparer_not_signed" | "rows_changed" | "open_notes";
  message: string;
}

export function summaryReviewerSignOffBlocker(f: SummaryReviewerFacts): SummarySignOffBlocker | null {
  if (!f.preparerSigned)
    return {
      code: "preparer_not_signed",
      message: "The preparer (staff or senior) signs off the summary first; the reviewer signs after.",
    };
  if (f.rowsChanged)
    return {
      code: "rows_changed",
      message:
        "The rows changed after the preparer signed off (a sample's results moved); the preparer must sign off again first.",
    };
  if (f.openNotes > 0)
    return {
      code: "open_notes",
      message: `${countOf(f.openNotes, "review note")} ${f.openNotes === 1 ? "is" : "are"} not cleared; clear ${f.openNotes === 1 ? "it" : "them"} before signing off.`,
    };
  return null;
}
