import { describe, expect, it } from "vitest";
import { engagementInvitation, type EngagementInvitationData } from "@/templates/email/engagement-invitation";
import { JUDGEMENT_CAUTION } from "@/templates/email/layout";
import { HOSTILE, hrefs } from "./fixtures";

const data: EngagementInvitationData = {
  recipient: { name: "Jonah Lindqvist" },
  invitedBy: { name: "Tomás Reyes" },
  role: "staff",
  engagement: { clientName: "Tessaly Outdoor", name: "Year-end audit 2026", periodEnd: "2026-12-31" },
  engagementUrl: "https://sondage.example/engagements/12",
  addedAt: new Date("2026-11-30T15:40:00Z"),
};

describe("engagement invitation", () => {
  it("names the engagement in the subject", () => {
    expect(engagementInvitation(data).subject).toBe("You have been added to Tessaly Outdoor — Year-end audit 2026");
  });

  it("links to the engagement in both parts", () => {
    const m = engagementInvitation(data);
    expect(m.text).toContain("https://sondage.example/engagements/12");
    expect(hrefs(m.html)).toEqual(["https://sondage.example/engagements/12", "https://sondage.example/engagements/12"]);
  });

  it("says who added the person, in what role, and when, in both parts", () => {
    const m = engagementInvitation(data);
    for (const part of [m.text, m.html].map((p) => p.replace(/\s+/g, " "))) {
      expect(part).toContain("Hello Jonah Lindqvist,");
      expect(part).toContain(
        "Tomás Reyes added you to the team of Tessaly Outdoor — Year-end audit 2026 in Sondage, as staff.",
      );
      expect(part).toContain("31 Dec 2026");
      expect(part).toContain("30 Nov 2026, 15:40 UTC");
    }
  });

  it("escapes names and engagement labels in the HTML part", () => {
    const m = engagementInvitation({
      ...data,
      invitedBy: { name: HOSTILE },
      engagement: { ...data.engagement, clientName: HOSTILE },
    });
    expect(m.html).not.toContain("<script>");
    expect(m.html).not.toContain("<img");
    expect(m.html).toContain(
      "&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; &lt;img src=x onerror=alert(1)&gt;",
    );
    expect(m.text).toContain(HOSTILE); // plain text carries it as typed; no mail client runs it
  });

  it("keeps the judgement caution for the sample messages, not the invitation", () => {
    expect(engagementInvitation(data).text).not.toContain("professional judgement");
    expect(JUDGEMENT_CAUTION).toContain("AU-C 530, ISA 530, AS 2315");
  });

  it("refuses a link that is not http(s)", () => {
    expect(() => engagementInvitation({ ...data, engagementUrl: "javascript:alert(1)" })).toThrow(TypeError);
  });

  it("opens the plain-text part with the wordmark and reads on its own", () => {
    const { text } = engagementInvitation(data);
    expect(text.startsWith("SONDAGE\n=======\n\nHello Jonah Lindqvist,")).toBe(true);
    expect(text).not.toMatch(/<[a-z]/i);
    expect(text).toContain("Open the engagement:\nhttps://sondage.example/engagements/12");
  });
});
