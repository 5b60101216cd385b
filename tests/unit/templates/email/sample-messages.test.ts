import { describe, expect, it } from "vitest";
import { EMAIL_TEMPLATES, renderEmailTemplate } from "@/templates/email";
import { JUDGEMENT_CAUTION } from "@/templates/email/layout";
import { HOSTILE, SAMPLE_URL, hrefs, sampleEvent } from "./fixtures";

const NOTE = { text: "Item 14 disagrees with the confirmation." };
const ANSWER = { text: "Credit note CN-0042 posted after year end; reply attached." };

// Every message about a sample, rendered from the same event.
const render = {
  "sample-ready-for-review": () => renderEmailTemplate("sample-ready-for-review", sampleEvent()),
  "review-note-raised": () => renderEmailTemplate("review-note-raised", { ...sampleEvent(), note: NOTE }),
  "review-note-answered": () =>
    renderEmailTemplate("review-note-answered", { ...sampleEvent(), note: NOTE, answer: ANSWER }),
  "review-note-cleared": () => renderEmailTemplate("review-note-cleared", { ...sampleEvent(), note: NOTE }),
  "sample-locked": () => renderEmailTemplate("sample-locked", sampleEvent()),
};

describe("every sample message", () => {
  it("covers every template but the invitations and the client-request messages (client-requests.test.ts)", () => {
    const notSample = [
      "engagement-invitation",
      "client-invitation",
      "staff-invitation",
      "request-list-sent",
      "request-file-returned",
      "request-reminders",
      "request-list-closed",
    ];
    expect(Object.keys(render).sort()).toEqual(
      Object.keys(EMAIL_TEMPLATES)
        .filter((k) => !notSample.includes(k))
        .sort(),
    );
  });

  for (const [name, make] of Object.entries(render)) {
    describe(name, () => {
      it("links to the sample in both parts", () => {
        const m = make();
        expect(m.text).toContain(`\n${SAMPLE_URL}\n`);
        expect(hrefs(m.html)).toEqual([SAMPLE_URL, SAMPLE_URL]);
      });

      it("names the sample and client in a one-line subject", () => {
        const { subject } = make();
        expect(subject).toContain("Receivables MUS (Tessaly Outdoor)");
        expect(subject).not.toMatch(/\n/);
      });

      it("says who acted and when, and greets the recipient, in both parts", () => {
        const m = make();
        for (const part of [m.text, m.html]) {
          expect(part).toContain("Hello Priya Nair,");
          expect(part).toContain("Tomás Reyes");
          expect(part).toContain("2 Dec 2026, 09:05 UTC");
        }
      });

      it("reminds the reader that conclusions rest on the auditor's judgement, in both parts", () => {
        const m = make();
        expect(m.text.replace(/\s+/g, " ")).toContain(JUDGEMENT_CAUTION);
        expect(m.html).toContain(JUDGEMENT_CAUTION.replace(/'/g, "&#39;"));
      });

      it("carries the ledger-green accent and the wordmark", () => {
        const m = make();
        expect(m.html).toContain("border-top:4px solid #24663f");
        expect(m.html).toMatch(/>Sondage<\/td>/);
        expect(m.text.startsWith("SONDAGE\n")).toBe(true);
      });
    });
  }

  it("escapes a hostile sample name and actor everywhere in the HTML", () => {
    const m = renderEmailTemplate(
      "sample-locked",
      sampleEvent({ sample: { name: HOSTILE }, actor: { name: "<b>Tom</b>" } }),
    );
    expect(m.html).not.toMatch(/<script|<img|<b>/);
    expect(m.html).toContain("&lt;b&gt;Tom&lt;/b&gt;");
    expect(m.subject).toBe(`Locked: ${HOSTILE} (Tessaly Outdoor)`);
  });
});
