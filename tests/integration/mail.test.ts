import net from "node:net";
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { closeMailer } from "@/lib/mail/transport";
import { notifyReviewNote, notifySampleLocked, notifySampleReadyForReview, type SampleNotice } from "@/lib/mail/notify";
import { deliverDueMail } from "@/lib/mail/outbox-worker";
import { sendMail } from "@/lib/mail/send";
import { claimDueMail, listUndeliveredMailByFirmId, MAX_ATTEMPTS, markMailRefused } from "@/lib/data/mail-outbox";
import * as outbox from "@/app/api/firm/mail-outbox/route";
import * as members from "@/app/api/engagements/[engagementId]/members/route";
import { call } from "./support/call";
import { auditCount, makeEngagement, makeFirm, makeUser } from "./support/factory";
import { addressedTo, clearInbox, readInbox, waitForMessage } from "./support/inbox";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

// Links are built from NEXTAUTH_URL; a base path checks that it is kept.
const APP_URL = "https://sondage.test/audit";
const saved = {
  NEXTAUTH_URL: process.env.NEXTAUTH_URL,
  SMTP_PORT: process.env.SMTP_PORT,
  MAIL_FROM: process.env.MAIL_FROM,
};

let firm: number, manager: number, admin: number, engagement: number;
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
  return call(members.POST, "POST", {
    as: manager,
    params: { engagementId: String(engagementId) },
    body: { userId, role },
  });
}

beforeAll(async () => {
  process.env.NEXTAUTH_URL = APP_URL;
  closeMailer();
  firm = await makeFirm();
  manager = await makeUser(firm, "manager");
  admin = await makeUser(firm, "partner", { admin: true });
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
    // Messages earlier test files queued go first (files run in any order), so the count below is this addition's.
    await deliverDueMail(getDb());
    const newcomer = await makeUser(firm, "senior");
    const [email, name, managerName] = await Promise.all([emailOf(newcomer), nameOf(newcomer), nameOf(manager)]);
    const r = await addMember(engagement, newcomer, "senior");
    expect(r.status).toBe(201);
    // Queued in the addition's transaction; the worker sends it.
    expect(
      Number((await getDb()("mail_outbox").where({ to_email: email, status: "pending" }).count({ n: "*" }).first())?.n),
    ).toBe(1);
    expect(await deliverDueMail(getDb())).toMatchObject({ sent: 1, refused: 0 });

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
    // Only the added person is written to about this engagement (the outbox may also deliver other tests' queued mail now).
    expect((await readInbox()).filter((x) => x.text.includes(link)).flatMap((x) => x.to)).toEqual([email]);
  });

  it("sends nothing when the addition is refused", async () => {
    const existing = await makeUser(firm, "staff");
    expect((await addMember(engagement, existing)).status).toBe(201);
    await deliverDueMail(getDb());
    await waitForMessage(addressedTo(await emailOf(existing)));
    await clearInbox();
    const again = await addMember(engagement, existing);
    expect(again.status).toBe(409);
    await deliverDueMail(getDb());
    expect(await readInbox()).toEqual([]);
    expect(
      Number(
        (
          await getDb()("mail_outbox")
            .where({ to_email: await emailOf(existing) })
            .count({ n: "*" })
            .first()
        )?.n,
      ),
    ).toBe(1); // the first addition's only
  });

  it("still adds the member when the SMTP server is down; the worker logs the failure, backs off, and sends once the relay is back", async () => {
    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    process.env.SMTP_PORT = String(await closedPort());
    closeMailer();
    const person = await makeUser(firm, "staff");
    const email = await emailOf(person);

    const r = await addMember(engagement, person);

    expect(r.status).toBe(201);
    expect(r.json.members.map((x: { userId: number }) => x.userId)).toContain(person);
    expect(await auditCount({ entity: "engagement_member", entity_id: `${engagement}:${person}`, action: "add" })).toBe(
      1,
    );
    expect(await deliverDueMail(getDb())).toMatchObject({ sent: 0, refused: 1 });
    expect(errors).toHaveBeenCalledWith(
      expect.stringMatching(
        new RegExp(`^mail: engagement-invitation to ${email} not sent \\(attempt 1\\) — .*ECONNREFUSED`),
      ),
    );
    expect((await readInbox()).filter(addressedTo(email))).toEqual([]);
    const row = (await getDb()("mail_outbox").where({ to_email: email }).first())!;
    expect(row).toMatchObject({ status: "pending", attempts: 1 });
    expect(new Date(row.next_attempt_at).getTime() - new Date(row.created_at).getTime()).toBeGreaterThanOrEqual(29_000); // 30 s backoff
    const seen = await call(outbox.GET, "GET", { as: admin });
    expect(seen.json.messages).toContainEqual(
      expect.objectContaining({
        toEmail: email,
        status: "pending",
        attempts: 1,
        lastError: expect.stringContaining("ECONNREFUSED"),
      }),
    );

    // Nothing is due before the backoff; then the relay is back and the time has come.
    expect(await deliverDueMail(getDb())).toMatchObject({ sent: 0, refused: 0 });
    process.env.SMTP_PORT = saved.SMTP_PORT;
    closeMailer();
    await getDb()("mail_outbox")
      .where({ id: row.id })
      .update({ next_attempt_at: getDb().fn.now(3) });
    expect(await deliverDueMail(getDb())).toMatchObject({ sent: 1 });
    await waitForMessage(addressedTo(email));
    expect(await deliverDueMail(getDb())).toMatchObject({ sent: 0 });
    expect((await readInbox()).filter(addressedTo(email))).toHaveLength(1);
    expect(await getDb()("mail_outbox").where({ id: row.id }).first("status", "attempts")).toEqual({
      status: "sent",
      attempts: 2,
    });
  });

  it("still adds the member when the mail settings are wrong, naming the setting in the log", async () => {
    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    process.env.MAIL_FROM = "not an address";
    closeMailer();
    const person = await makeUser(firm, "staff");

    expect((await addMember(engagement, person)).status).toBe(201);
    await deliverDueMail(getDb());
    expect(errors).toHaveBeenCalledWith(expect.stringContaining("MAIL_FROM: MAIL_FROM must be an address"));
  });
});

describe("sample notices", () => {
  const sample = { id: 34, name: "Receivables MUS" };
  const preparer = { name: "Priya Nair", email: "priya.nair@marrow-quill.test" };
  const reviewer = { name: "Tomás Reyes", email: "tomas.reyes@marrow-quill.test" };
  const partner = { name: "Helena Brandt", email: "helena.brandt@marrow-quill.test" };
  const notice = (over: Partial<SampleNotice> = {}): SampleNotice => ({
    recipients: [reviewer, partner],
    actor: preparer,
    engagement: { id: 12, clientName: "Tessaly Outdoor", name: "Year-end audit 2026" },
    sample,
    at: new Date("2026-12-02T09:05:00Z"),
    ...over,
  });
  const sampleLink = `${APP_URL}/engagements/12/samples/34`;

  it("ready for review reaches each reviewer once, not the preparer, linking to the sample", async () => {
    const results = await notifySampleReadyForReview(
      getDb(),
      notice({ recipients: [reviewer, partner, { ...reviewer, email: reviewer.email.toUpperCase() }, preparer] }),
    );
    expect(results.map((r) => r.sent)).toEqual([true, true]);
    await deliverDueMail(getDb());
    await waitForMessage(addressedTo(partner.email));
    await waitForMessage(addressedTo(reviewer.email));
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
    await notifyReviewNote(getDb(), "raised", {
      ...notice({ actor: reviewer, recipients: [preparer] }),
      note: { text },
    });
    await deliverDueMail(getDb());
    const m = await waitForMessage(addressedTo(preparer.email));
    expect(m.subject).toBe("Review note on Receivables MUS (Tessaly Outdoor)");
    expect(m.html).not.toContain("<script>");
    expect(m.html).toContain("&lt;script&gt;");
    expect(m.text).toContain(`> ${text}`);
  });

  it("an answered note reaches the reviewer with the answer", async () => {
    await notifyReviewNote(getDb(), "answered", {
      ...notice({ recipients: [reviewer] }),
      note: { text: "Explain item 14." },
      answer: { text: "Credit note CN-0042." },
    });
    await deliverDueMail(getDb());
    const m = await waitForMessage(addressedTo(reviewer.email));
    expect(m.subject).toBe("Review note answered: Receivables MUS (Tessaly Outdoor)");
    expect(m.text).toContain("> Credit note CN-0042.");
    expect(m.html).toContain(`href="${sampleLink}"`);
  });

  it("a cleared note reaches the preparer", async () => {
    await notifyReviewNote(getDb(), "cleared", {
      ...notice({ actor: reviewer, recipients: [preparer] }),
      note: { text: "Explain item 14." },
    });
    await deliverDueMail(getDb());
    const m = await waitForMessage(addressedTo(preparer.email));
    expect(m.subject).toBe("Review note cleared: Receivables MUS (Tessaly Outdoor)");
    expect(m.text).toContain(sampleLink);
  });

  it("a locked sample reaches the team, with a link the caller chose", async () => {
    const chosen = `${APP_URL}/engagements/12/samples/34/workpaper`;
    await notifySampleLocked(getDb(), notice({ actor: partner, recipients: [preparer, reviewer], sampleUrl: chosen }));
    await deliverDueMail(getDb());
    await waitForMessage(addressedTo(preparer.email));
    await waitForMessage(addressedTo(reviewer.email));
    const inbox = await readInbox();
    expect(inbox.map((m) => m.to[0]).sort()).toEqual([preparer.email, reviewer.email].sort());
    for (const m of inbox) {
      expect(m.subject).toBe("Locked: Receivables MUS (Tessaly Outdoor)");
      expect(m.html).toContain(`href="${chosen}"`);
      expect(m.text).toContain(chosen);
    }
  });

  it("a dead relay never reaches the caller: the notice is queued at once and the worker logs the refusal", async () => {
    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    process.env.SMTP_PORT = String(await closedPort());
    closeMailer();
    const started = performance.now();
    const results = await notifySampleLocked(getDb(), notice({ actor: partner, recipients: [preparer] }));
    expect(performance.now() - started).toBeLessThan(2_000); // no SMTP connection on the request's path
    expect(results).toEqual([expect.objectContaining({ sent: true, to: preparer.email })]);
    expect(errors).not.toHaveBeenCalled();
    expect(await deliverDueMail(getDb())).toMatchObject({ refused: 1 });
    expect(errors).toHaveBeenCalledTimes(1);
  });
});

describe("the outbox", () => {
  const person = { name: "Ola Lind", email: "ola.lind@marrow-quill.test" };
  const queue = (db = getDb()) =>
    sendMail(db, {
      to: person,
      template: "sample-locked",
      data: {
        recipient: { name: person.name },
        actor: { name: "A" },
        engagement: { clientName: "C", name: "E" },
        sample: { name: "S" },
        sampleUrl: `${APP_URL}/x`,
        at: new Date(),
      },
    });

  it("writes nothing when the change's transaction rolls back", async () => {
    const before = await getDb()("mail_outbox").count({ n: "*" }).first();
    await expect(
      getDb().transaction(async (trx) => {
        expect((await queue(trx)).sent).toBe(true);
        throw new Error("the change failed");
      }),
    ).rejects.toThrow("the change failed");
    expect(await getDb()("mail_outbox").count({ n: "*" }).first()).toEqual(before);
  });

  it("never sends twice after a crash: a message a dead worker held mid-send is marked unknown, not resent, and shown to the admin", async () => {
    await deliverDueMail(getDb());
    await clearInbox();
    const queued = await queue();
    if (!queued.sent) throw new Error(queued.reason);
    const [claimed] = await claimDueMail(getDb(), { holder: "worker-that-crashed", limit: 1 });
    expect(claimed.id).toBe(queued.outboxId);
    // The crashed worker's claim runs out (moved back rather than waiting CLAIM_SECONDS).
    await getDb()("mail_outbox")
      .where({ id: claimed.id })
      .update({ claimed_until: getDb().raw("NOW(3) - INTERVAL 1 SECOND") });
    expect(await deliverDueMail(getDb())).toMatchObject({ sent: 0, abandoned: 1 });
    expect(await deliverDueMail(getDb())).toMatchObject({ sent: 0, abandoned: 0 });
    expect((await readInbox()).filter(addressedTo(person.email))).toEqual([]);
    expect(await getDb()("mail_outbox").where({ id: claimed.id }).first("status")).toEqual({ status: "unknown" });
  });

  it("gives a message up as failed after the last attempt", async () => {
    const queued = await queue();
    if (!queued.sent) throw new Error(queued.reason);
    await getDb()("mail_outbox")
      .where({ id: queued.outboxId })
      .update({ status: "sending", claimed_by: "w", attempts: MAX_ATTEMPTS });
    await markMailRefused(getDb(), {
      id: queued.outboxId,
      holder: "w",
      attempts: MAX_ATTEMPTS,
      error: "550 mailbox unavailable",
    });
    expect(await getDb()("mail_outbox").where({ id: queued.outboxId }).first("status", "last_error")).toEqual({
      status: "failed",
      last_error: "550 mailbox unavailable",
    });
  });

  it("lets two workers claim at once without sharing a message (SKIP LOCKED)", async () => {
    await deliverDueMail(getDb());
    const ids = [];
    for (let i = 0; i < 10; i++) {
      const q = await queue();
      if (q.sent) ids.push(q.outboxId);
    }
    const [a, b] = await Promise.all([
      claimDueMail(getDb(), { holder: "server-a", limit: 6 }),
      claimDueMail(getDb(), { holder: "server-b", limit: 6 }),
    ]);
    const claimedA = a.map((m) => m.id),
      claimedB = b.map((m) => m.id);
    expect(claimedA.filter((id) => claimedB.includes(id))).toEqual([]);
    expect([...claimedA, ...claimedB].sort((x, y) => x - y)).toEqual(ids);
    await getDb()("mail_outbox").whereIn("id", ids).update({ status: "sent" });
  });

  it("lists the firm's undelivered messages for its admin only", async () => {
    const rows = await listUndeliveredMailByFirmId(getDb(), { firmId: firm });
    expect(rows.every((r) => r.status !== "pending" || r.attempts > 0)).toBe(true);
    const refused = await call(outbox.GET, "GET", { as: manager });
    expect(refused.status).toBe(403);
  });
});
