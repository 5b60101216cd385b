import { describe, expect, it } from "vitest";
import { summaryReviewerSignOffBlocker } from "@/lib/misstatements/sign-off-blockers";

// Preparer before reviewer, on the rows as they stand, with no note open (common practice). The server
// answers the same code and words as its 409 (lib/misstatements/review.ts).
describe("why the reviewer cannot sign off the summary yet", () => {
  it("asks for the preparer first, whatever else is open", () => {
    expect(summaryReviewerSignOffBlocker({ preparerSigned: false, rowsChanged: true, openNotes: 2 })).toEqual({
      code: "preparer_not_signed",
      message: "The preparer (staff or senior) signs off the summary first; the reviewer signs after.",
    });
  });

  it("asks the preparer to sign again when the rows moved after their sign-off", () => {
    expect(summaryReviewerSignOffBlocker({ preparerSigned: true, rowsChanged: true, openNotes: 0 })?.code).toBe(
      "rows_changed",
    );
  });

  it("counts the open notes in words, never '1 notes'", () => {
    expect(summaryReviewerSignOffBlocker({ preparerSigned: true, rowsChanged: false, openNotes: 1 })?.message).toBe(
      "1 review note is not cleared; clear it before signing off.",
    );
    expect(summaryReviewerSignOffBlocker({ preparerSigned: true, rowsChanged: false, openNotes: 3 })?.message).toBe(
      "3 review notes are not cleared; clear them before signing off.",
    );
  });

  it("lets the reviewer sign when the preparer signed these rows and no note is open", () => {
    expect(summaryReviewerSignOffBlocker({ preparerSigned: true, rowsChanged: false, openNotes: 0 })).toBeNull();
  });
});
