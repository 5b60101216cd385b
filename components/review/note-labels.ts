import type { ReviewNote } from "@/lib/data/review-notes";

/** One set of words for a review note's state: the panel, the item's row and the workpaper. */
export const NOTE_STATUS_LABELS: Record<ReviewNote["status"], string> = {
  open: "Open",
  answered: "Answered",
  cleared: "Cleared",
};
export const NOTE_STATUS_TONES = { open: "red", answered: "amber", cleared: "green" } as const;

export interface ItemNoteMark {
  number: number;
  status: ReviewNote["status"];
}

/** Each item's review notes by their number in the panel ("Note 2"), for the item's row in the grid. */
export function notesOnItems(notes: ReviewNote[]): Record<number, ItemNoteMark[]> {
  const byItem: Record<number, ItemNoteMark[]> = {};
  notes.forEach((n, i) => {
    if (n.itemId !== null) (byItem[n.itemId] ??= []).push({ number: i + 1, status: n.status });
  });
  return byItem;
}
