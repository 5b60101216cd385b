import { describe, expect, it } from "vitest";
import { sampleReadyForReview } from "@/templates/email/sample-ready-for-review";
import { sampleEvent } from "./fixtures";

describe("sample ready for review", () => {
  it("has the subject reviewers scan for", () => {
    expect(sampleReadyForReview(sampleEvent()).subject).toBe("Ready for review: Receivables MUS (Tessaly Outdoor)");
  });

  it("says who sent it and asks for review", () => {
    const { text } = sampleReadyForReview(sampleEvent());
    expect(text).toContain('Tomás Reyes marked the sample "Receivables MUS" ready for review.');
    expect(text).toContain("Sent by:    Tomás Reyes, 2 Dec 2026, 09:05 UTC");
    expect(text).toContain("Review the sample:\nhttps://sondage.example/engagements/12/samples/34");
  });
});
