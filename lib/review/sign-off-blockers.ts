/**
 * Why a sign-off cannot be given yet, in the words the sample page prints beside the disabled
 * button. Pure (no I/O): the page and the server (lib/review/sign-offs.ts) refuse for the same
 * reasons, so the screen never offers what the server would refuse.
 */

export interface PreparerFacts {
  drawn: boolean;
  /** Every item of the current draw has a result. */
  complete: boolean;
  /** The auditor's conclusion as recorded, or null. */
  concluded: { responses: unknown[] } | null;
  /** The computed result calls for a response (SampleEvaluation.computed.responseNeeded). */
  responseNeeded: boolean;
}

export function preparerSignOffBlocker(f: PreparerFacts): string | null {
  if (!f.drawn) return "Draw the sample and record its results first.";
  if (!f.complete) return "Record a result for every item first.";
  if (!f.concluded) return "Record the auditor's conclusion first.";
  if (f.responseNeeded && f.concluded.responses.length === 0)
    return "Record the response the computed result calls for first.";
  return null;
}

export interface ReviewerFacts {
  preparerSigned: boolean;
  concluded: boolean;
  openNotes: number;
}

export function reviewerSignOffBlocker(f: ReviewerFacts): string | null {
  if (!f.preparerSigned) return "The preparer signs off first.";
  if (!f.concluded) return "The preparer records the auditor's conclusion first.";
  if (f.openNotes > 0)
    return f.openNotes === 1
      ? "Clear the open review note first."
      : `Clear the ${f.openNotes} open review notes first.`;
  return null;
}
