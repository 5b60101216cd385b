import net from "node:net";
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { closeMailer } from "@/lib/mail/transport";
import { notifyReviewNote, notifySampleLocked, notifySampleReadyForReview, type SampleNotice } from "@/lib/mail/notify";
import * as members from "@/app/api/engagements/[engagementId]/members/route";
import { call } from "./support/call";
import { auditCount, makeEngagement, makeFirm, makeUser } from "./support/factory";
import { addressedTo, clearInbox, readInbox, waitForMessage } from "./support/inbox";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

// Links are built from NEXTAUTH_URL; a base path checks that it is kept.
const APP_URL = "https://sondage.test/audit";
const saved = { NEXTAUTH_URL: process.env.NEXTAUTH_URL, SMTP_PORT: process.env.SMTP_PORT, MAIL_FROM: process.env.MAIL_FROM };

let firm: number, manager: number, engagement: number;
const emailOf = async (userId: number) => (await getDb()("users").where({ id: userId }).first("email"))!.email;
const nameOf = async (userId: number) => (await getDb()("users").where({ id: userId }).first("name"))!.name;

/** A loopback port with nothing listening on it: the relay is down. */
async function closedPort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  const { port } = server.address() as net.AddressInfo;
  await new Promise<void>((r) => server.close(() => r()));
  return port;
}

function addMember(engagementId: number, userId: number, role = "staff") {
  return call(members.POST, "POST", { as: manager, params: { engagementId: String(engagementId) }, body: { userId, role } });
}

beforeAll(async () => {
  process.env.NEXTAUTH_URL = APP_URL;
  closeMailer();
  firm = await makeFirm();
  manager = await makeUser(firm, "manager");
  engagement = await makeEngagement(firm, manager, [[manager, "manager"]]);
});

beforeEach(async () => {
  await clearInbox();
});

afterEach(() => {
  Object.assign(process.env, { SMTP_PORT: saved.SMTP_PORT, MAIL_FROM: saved.MAIL_FROM });
  closeMailer();
  vi.restoreAllMocks();
});

afterAll(async () => {
  if (saved.NEXTAUTH_URL === undefined) delete process.env.NEXTAUTH_URL;
  else process.env.NEXTAUTH_URL = saved.NEXTAUTH_URL;
  closeMailer();
  await getDb().destroy();
});

describe("invitation when a member is added", () => {
  it("arrives in the inbox addressed to the added person, with text and HTML parts linking to the engagement", async () => {
    const newcomer = await makeUser(firm, "senior");
    const [email, name, managerName] = await Promise.all([emailOf(newcomer), nameOf(newcomer), nameOf(manager)]);
    const r = await addMember(engagement, newcomer, "senior");
    expect(r.status).toBe(201);

    const m = await waitForMessage(addressedTo(email));
    const link = `${APP_URL}/engagements/${engagement}`;
    expect(m.to).toEqual([email]);
    expect(m.from).toContain("no-reply@");
    expect(m.subject).toMatch(/^You have been added to Client \d+ — Audit$/);
    expect(m.text).toContain(`Hello ${name},`);
    expect(m.text).toContain(`\n${link}\n`);
    expect(m.text.replace(/\s+/g, " ")).toContain(`${managerName} added you to the team`);
    expect(m.html).toContain(`href="${link}"`);
    expect(m.html).toContain("as senior.");
    // Only the added person is written to.
    expect((await readInbox()).flatMap((x) => x.to)).toEqual([email]);
  });

  it("sends nothing when the addition is refused", async () => {
    const existing = await makeUser(firm, "staff");
    expect((await addMember(engagement, existing)).status).toBe(201);
    await clearInbox();
    const again = await addMember(engagement, existing);
    expect(again.status).toBe(409);
    expect(await readInbox()).toEqual([]); // the route awaits its send, so nothing is still on its way
  });

  it("still adds the member when the SMTP server is down, and logs the failure", async () => {
    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    process.env.SMTP_PORT = String(await closedPort());
    closeMailer();
    const person = await makeUser(firm, "staff");
    const email = await emailOf(person);

    const r = await addMember(engagement, person);

    expect(r.status).toBe(201);
    expect(r.json.members.map((x: { userId: number }) => x.userId)).toContain(person);
    expect(await auditCount({ entity: "engagement_member", entity_id: `${engagement}:${person}`, action: "add" })).toBe(1);
    expect(errors).toHaveBeenCalledWith(expect.stringMatching(new RegExp(`^mail: engagement-invitation to ${email} not sent — .*ECONNREFUSED`)));
    expect((await readInbox()).filter(addressedTo(email))).toEqual([]);
  });

  it("still adds the member when the mail settings are wrong, naming the setting in the log", async () => {
    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    process.env.MAIL_FROM = "not an address";
    closeMailer();
    const person = await makeUser(firm, "staff");

    expect((await addMember(engagement, person)).status).toBe(201);
    expect(errors).toHaveBeenCalledWith(expect.stringContaining("MAIL_FROM: MAIL_FROM must be an address"));
  });
});

describe("sample notices", () => {
  const sample = { id: 34, name: "Receivables MUS" };
  const preparer = { name: "Priya Nair", email: "priya.nair@marrow-quill.test" };
  const reviewer = { name: "Tomás Reyes", email: "tomas.reyes@marrow-quill.test" };
  const partner = { name: "Helena Brandt", email: "helena.brandt@marrow-quill.test" };
  const notice = (over: Partial<SampleNotice> = {}): SampleNotice => ({
    recipients: [reviewer, partner], actor: preparer,
    engagement: { id: 12, clientName: "Tessaly Outdoor", name: "Year-end audit 2026" }, sample,
    at: new Date("2026-12-02T09:05:00Z"), ...over,
  });
  const sampleLink = `${APP_URL}/engagements/12/samples/34`;

  it("ready for review reaches each reviewer once, not the preparer, linking to the sample", async () => {
    const results = await notifySampleReadyForReview(notice({ recipients: [reviewer, partner, { ...reviewer, email: reviewer.email.toUpperCase() }, preparer] }));
    expect(results.map((r) => r.sent)).toEqual([true, true]);
    const inbox = await readInbox();
    expect(inbox.map((m) => m.to).sort()).toEqual([[partner.email], [reviewer.email]]);
    for (const m of inbox) {
      expect(m.subject).toBe("Ready for review: Receivables MUS (Tessaly Outdoor)");
      expect(m.text).toContain(sampleLink);
      expect(m.html).toContain(`href="${sampleLink}"`);
      expect(m.text).toContain("professional");
    }
    expect(inbox.find(addressedTo(partner.email))?.text).toContain("Hello Helena Brandt,");
  });

  it("a raised note arrives with the note's text escaped in HTML and quoted in text", async () => {
    const text = `Item 14 <script>alert("x")</script> disagrees.`;
    await notifyReviewNote("raised", { ...notice({ actor: reviewer, recipients: [preparer] }), note: { text } });
    const m = await waitForMessage(addressedTo(preparer.email));
    expect(m.subject).toBe("Review note on Receivables MUS (Tessaly Outdoor)");
    expect(m.html).not.toContain("<script>");
    expect(m.html).toContain("&lt;script&gt;");
    expect(m.text).toContain(`> ${text}`);
  });

  it("an answered note reaches the reviewer with the answer", async () => {
    await notifyReviewNote("answered", { ...notice({ recipients: [reviewer] }), note: { text: "Explain item 14." }, answer: { text: "Credit note CN-0042." } });
    const m = await waitForMessage(addressedTo(reviewer.email));
    expect(m.subject).toBe("Review note answered: Receivables MUS (Tessaly Outdoor)");
    expect(m.text).toContain("> Credit note CN-0042.");
    expect(m.html).toContain(`href="${sampleLink}"`);
  });

  it("a cleared note reaches the preparer", async () => {
    await notifyReviewNote("cleared", { ...notice({ actor: reviewer, recipients: [preparer] }), note: { text: "Explain item 14." } });
    const m = await waitForMessage(addressedTo(preparer.email));
    expect(m.subject).toBe("Review note cleared: Receivables MUS (Tessaly Outdoor)");
    expect(m.text).toContain(sampleLink);
  });

  it("a locked sample reaches the team, with a link the caller chose", async () => {
    const chosen = `${APP_URL}/engagements/12/samples/34/workpaper`;
    await notifySampleLocked(notice({ actor: partner, recipients: [preparer, reviewer], sampleUrl: chosen }));
    const inbox = await readInbox();
    expect(inbox.map((m) => m.to[0]).sort()).toEqual([preparer.email, reviewer.email].sort());
    for (const m of inbox) {
      expect(m.subject).toBe("Locked: Receivables MUS (Tessaly Outdoor)");
      expect(m.html).toContain(`href="${chosen}"`);
      expect(m.text).toContain(chosen);
    }
  });

  it("reports and logs a failed send without throwing", async () => {
    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    process.env.SMTP_PORT = String(await closedPort());
    closeMailer();
    const results = await notifySampleLocked(notice({ actor: partner, recipients: [preparer] }));
    expect(results).toEqual([expect.objectContaining({ sent: false, to: preparer.email })]);
    expect(errors).toHaveBeenCalledTimes(1);
  });
});
