import { describe, expect, it } from "vitest";
import { reviewNoteAnswered } from "@/templates/email/review-note-answered";
import { reviewNoteCleared } from "@/templates/email/review-note-cleared";
import { reviewNoteRaised } from "@/templates/email/review-note-raised";
import { HOSTILE, SAMPLE_URL, hrefs, sampleEvent } from "./fixtures";

const note = { text: `Item 14: the confirmation disagrees by 1,250.00.\n${HOSTILE}\nPlease explain.` };

describe("review note raised", () => {
  const m = reviewNoteRaised({ ...sampleEvent(), note });

  it("has its subject", () => {
    expect(m.subject).toBe("Review note on Receivables MUS (Tessaly Outdoor)");
  });

  it("escapes a <script> in the note and keeps its line breaks", () => {
    expect(m.html).not.toContain("<script>");
    expect(m.html).not.toContain("<img");
    expect(m.html).toContain("&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;");
    expect(m.html).toMatch(/white-space:pre-wrap">Item 14: the confirmation disagrees by 1,250\.00\.\n&lt;script&gt;/);
  });

  it("quotes the note in the plain-text part, line by line", () => {
    expect(m.text).toContain(
      `Tomás Reyes wrote:\n> Item 14: the confirmation disagrees by 1,250.00.\n> ${HOSTILE}\n> Please explain.`,
    );
  });

  it("links to the sample in both parts", () => {
    expect(m.text).toContain(SAMPLE_URL);
    expect(hrefs(m.html)).toContain(SAMPLE_URL);
  });
});

describe("review note answered", () => {
  const m = reviewNoteAnswered({ ...sampleEvent(), note, answer: { text: "See </div><script>steal()</script>" } });

  it("has its subject", () => {
    expect(m.subject).toBe("Review note answered: Receivables MUS (Tessaly Outdoor)");
  });

  it("shows the note and the answer, both escaped", () => {
    expect(m.html).not.toContain("<script>");
    expect(m.html).toContain("See &lt;/div&gt;&lt;script&gt;steal()&lt;/script&gt;");
    expect(m.text).toContain("Tomás Reyes answered:\n> See </div><script>steal()</script>");
    expect(m.text).toContain("The note:\n> Item 14");
  });
});

describe("review note cleared", () => {
  const m = reviewNoteCleared({ ...sampleEvent(), note });

  it("has its subject", () => {
    expect(m.subject).toBe("Review note cleared: Receivables MUS (Tessaly Outdoor)");
  });

  it("says who cleared it and when", () => {
    expect(m.text).toContain("Cleared by: Tomás Reyes, 2 Dec 2026, 09:05 UTC");
    expect(m.html).not.toContain("<script>");
  });
});
