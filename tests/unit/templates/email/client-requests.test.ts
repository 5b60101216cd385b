import { describe, expect, it } from "vitest";
import { renderEmailTemplate } from "@/templates/email";

const engagement = { clientName: "Tessaly Outdoor Supply Inc.", name: "Financial statement audit FY2026" };

describe("client request e-mails", () => {
  it("sends the request list with its due date, count, message and link, escaping the message in HTML", () => {
    const m = renderEmailTemplate("request-list-sent", {
      recipient: { name: "Carla Mendes" },
      sentBy: { name: "Priya Nair" },
      engagement,
      title: "Receivables <docs>",
      itemCount: 3,
      dueDate: "2026-12-15",
      message: "Please use the <b>portal</b>",
      listUrl: "https://sondage.test/requests/7",
    });
    expect(m.subject).toMatch(/^Documents requested: Receivables <docs> — due /);
    expect(m.text).toContain("https://sondage.test/requests/7");
    expect(m.text).toContain("Please use the <b>portal</b>");
    expect(m.html).toContain("Please use the &lt;b&gt;portal&lt;/b&gt;");
    expect(m.html).not.toContain("<b>portal</b>");
    // Clients see no results, so the e-mail carries no judgement caution about them.
    expect(m.text).not.toMatch(/AU-C 530/);
  });

  it("tells the contact a list closed, why, and where to see what they sent (issue 19)", () => {
    const m = renderEmailTemplate("request-list-closed", {
      recipient: { name: "Carla Mendes" },
      engagement,
      title: "Receivables <docs>",
      reason: "The sample was locked: its workpaper is final.",
      listUrl: "https://sondage.test/requests/7",
    });
    expect(m.subject).toBe("Request list closed: Receivables <docs>");
    expect(m.text.replace(/\s+/g, " ")).toContain("no longer takes files on it");
    expect(m.text).toContain("The sample was locked: its workpaper is final");
    expect(m.text).toContain("https://sondage.test/requests/7");
    expect(m.html).toContain("Receivables &lt;docs&gt;");
    expect(m.text).not.toMatch(/AU-C 530/);
  });

  it("names the item, the file and the reason when a file is sent back", () => {
    const m = renderEmailTemplate("request-file-returned", {
      recipient: { name: "Carla" },
      returnedBy: { name: "Jonah" },
      engagement,
      title: "Receivables",
      itemRef: "INV-1043",
      fileName: "scan.pdf",
      reason: "The page with the total is missing.",
      listUrl: "https://sondage.test/requests/7",
    });
    expect(m.subject).toBe("More needed for INV-1043 (Receivables)");
    expect(m.text).toContain("The page with the total is missing.");
    expect(m.text).toContain("scan.pdf");
  });

  it("sums overdue items over lists in the digest and shortens a long list of references", () => {
    const refs = Array.from({ length: 15 }, (_, i) => `INV-${100 + i}`);
    const m = renderEmailTemplate("request-reminders", {
      recipient: { name: "Carla" },
      audience: "client",
      today: "2026-12-02",
      lists: [
        { title: "A", dueDate: "2026-11-30", itemRefs: refs, url: "https://sondage.test/requests/1", engagement },
        { title: "B", dueDate: "2026-11-29", itemRefs: ["X-1"], url: "https://sondage.test/requests/2", engagement },
      ],
    });
    expect(m.subject).toBe("Reminder: 16 requested items overdue");
    expect(m.text).toContain("INV-111 and 3 more");
    expect(m.text).toContain("X-1");
    const team = renderEmailTemplate("request-reminders", {
      recipient: { name: "Priya" },
      audience: "team",
      today: "2026-12-02",
      lists: [{ title: "B", dueDate: "2026-11-29", itemRefs: ["X-1"], url: "https://sondage.test/e/1", engagement }],
    });
    expect(team.subject).toBe("Client requests overdue: 1 item");
  });

  it("gives a new contact the password link and an existing one the sign-in page", () => {
    const fresh = renderEmailTemplate("client-invitation", {
      recipient: { name: "Carla" },
      invitedBy: { name: "Priya" },
      firmName: "Marrow & Quill",
      engagement,
      actionUrl: "https://sondage.test/invitation/abc",
      needsPassword: true,
      expiresInDays: 14,
    });
    expect(fresh.text).toContain("Choose your password");
    expect(fresh.text).toContain("14 days");
    const known = renderEmailTemplate("client-invitation", {
      recipient: { name: "Carla" },
      invitedBy: { name: "Priya" },
      firmName: "Marrow & Quill",
      engagement,
      actionUrl: "https://sondage.test/sign-in",
      needsPassword: false,
      expiresInDays: 14,
    });
    expect(known.text).toContain("Sign in with your existing Sondage account.");
  });
});
