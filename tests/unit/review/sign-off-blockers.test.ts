import { describe, expect, it } from "vitest";
import { preparerSignOffBlocker, reviewerSignOffBlocker } from "@/lib/review/sign-off-blockers";

// The order mirrors the server's refusals in lib/review/sign-offs.ts (draw → results → conclusion →
// response; preparer → conclusion → open notes), so the page says what the server would answer.
const ready = { drawn: true, complete: true, concluded: { responses: [] }, responseNeeded: false };

describe("why the preparer cannot sign off yet", () => {
  it("names the first missing step", () => {
    expect(preparerSignOffBlocker({ ...ready, drawn: false, complete: false, concluded: null })).toBe(
      "Draw the sample and record its results first.",
    );
    expect(preparerSignOffBlocker({ ...ready, complete: false, concluded: null })).toBe(
      "Record a result for every item first.",
    );
    expect(preparerSignOffBlocker({ ...ready, concluded: null })).toBe("Record the auditor's conclusion first.");
  });

  it("asks for the response only when the computed result calls for one", () => {
    expect(preparerSignOffBlocker({ ...ready, responseNeeded: true })).toBe(
      "Record the response the computed result calls for first.",
    );
    expect(
      preparerSignOffBlocker({ ...ready, responseNeeded: true, concluded: { responses: [{ kind: "extend" }] } }),
    ).toBeNull();
    expect(preparerSignOffBlocker(ready)).toBeNull();
  });
});

describe("why the reviewer cannot sign off yet", () => {
  it("waits for the preparer, then the conclusion, then the open notes", () => {
    expect(reviewerSignOffBlocker({ preparerSigned: false, concluded: false, openNotes: 2 })).toBe(
      "The preparer signs off first.",
    );
    expect(reviewerSignOffBlocker({ preparerSigned: true, concluded: false, openNotes: 2 })).toBe(
      "The preparer records the auditor's conclusion first.",
    );
    expect(reviewerSignOffBlocker({ preparerSigned: true, concluded: true, openNotes: 1 })).toBe(
      "Clear the open review note first.",
    );
    expect(reviewerSignOffBlocker({ preparerSigned: true, concluded: true, openNotes: 3 })).toBe(
      "Clear the 3 open review notes first.",
    );
    expect(reviewerSignOffBlocker({ preparerSigned: true, concluded: true, openNotes: 0 })).toBeNull();
  });
});
