import { createHash } from "node:crypto";
import bcrypt from "bcryptjs";
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { runMailWorkerDuringTests } from "./support/mail-worker";
import { runRequestReminders } from "@/lib/requests/reminders";
import { call, callRaw } from "./support/call";
import { auditCount, makeEngagement, makeFirm, makeUser } from "./support/factory";
import { addressedTo, clearInbox, readInbox, waitForMessage } from "./support/inbox";
import {
  drawSample,
  listSampleItems,
  loadCanonicalPopulation,
  planSample,
  saveResult,
  concludeSample,
} from "./support/samples";
import * as contacts from "@/app/api/engagements/[engagementId]/client-contacts/route";
import * as teamLists from "@/app/api/engagements/[engagementId]/samples/[sampleId]/requests/route";
import * as teamList from "@/app/api/engagements/[engagementId]/samples/[sampleId]/requests/[listId]/route";
import * as teamFile from "@/app/api/engagements/[engagementId]/samples/[sampleId]/requests/[listId]/files/[fileId]/route";
import * as accept from "@/app/api/engagements/[engagementId]/samples/[sampleId]/requests/[listId]/files/[fileId]/accept/route";
import * as sendBack from "@/app/api/engagements/[engagementId]/samples/[sampleId]/requests/[listId]/files/[fileId]/return/route";
import * as evidenceList from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/[itemId]/evidence/route";
import * as signOff from "@/app/api/engagements/[engagementId]/samples/[sampleId]/sign-off/route";
import * as lock from "@/app/api/engagements/[engagementId]/samples/[sampleId]/lock/route";
import * as myLists from "@/app/api/requests/route";
import * as myList from "@/app/api/requests/[listId]/route";
import * as myItem from "@/app/api/requests/[listId]/items/[requestItemId]/route";
import * as myFiles from "@/app/api/requests/[listId]/items/[requestItemId]/files/route";
import * as myFile from "@/app/api/requests/[listId]/files/[fileId]/route";
import * as invitation from "@/app/api/invitations/[token]/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let firm: number, manager: number, senior: number, staff: number, otherClient: number;
let engagement: number, sampleId: number, seniorEmail: string;
let items: Awaited<ReturnType<typeof listSampleItems>>;
let carla: { userId: number; email: string };

const ascii = (s: string) => new TextEncoder().encode(s);
const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");
// ISO 32000-1:2008 §7.5.2: a PDF file begins with "%PDF-1.n".
const PDF = ascii("%PDF-1.7\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n");
const CSV = ascii("invoice,paid\nINV001,1250.00\n");

const sp = (extra: Record<string, string> = {}) => ({
  engagementId: String(engagement),
  sampleId: String(sampleId),
  ...extra,
});
const dueIn = (days: number) => new Date(Date.now() + days * 86400_000).toISOString().slice(0, 10);
const createList = (as: number, body: Record<string, unknown>) =>
  call(teamLists.POST, "POST", {
    as,
    params: sp(),
    body: {
      title: "Receivables — supporting documents",
      dueDate: dueIn(10),
      needs: ["invoice", "remittance"],
      items: "all",
      ...body,
    },
  });
const clientUpload = (as: number, listId: number, requestItemId: number, fileName: string, file: Uint8Array) =>
  call(myFiles.POST, "POST", {
    as,
    params: { listId: String(listId), requestItemId: String(requestItemId) },
    query: { fileName },
    file,
  });
const clientView = (as: number, listId: number) => call(myList.GET, "GET", { as, params: { listId: String(listId) } });

beforeAll(async () => {
  firm = await makeFirm();
  [manager, senior, staff, otherClient] = await Promise.all([
    makeUser(firm, "manager"),
    makeUser(firm, "senior"),
    makeUser(firm, "staff"),
    makeUser(firm, "client"),
  ]);
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
    [staff, "staff"],
    [otherClient, "client"],
  ]);
  seniorEmail = (await getDb()("users").where({ id: senior }).first("email"))!.email;
  const { populationId } = await loadCanonicalPopulation(senior, engagement);
  sampleId = (
    await planSample(senior, engagement, {
      populationId,
      params: {
        method: "random",
        estimator: "difference",
        tolerableMisstatement: "5000",
        sampleSize: 6,
        sizeReason: "test",
      },
    })
  ).json.sample.id;
  await drawSample(senior, engagement, sampleId, 7);
  items = await listSampleItems(senior, engagement, sampleId);
});

beforeEach(async () => {
  await clearInbox();
});

afterAll(async () => {
  await getDb().destroy();
});

// Registered after the afterAll above: vitest runs after-hooks in reverse, so the worker stops before the pool closes.
runMailWorkerDuringTests();

describe("inviting a client contact", () => {
  it("lets a senior invite; the contact gets a one-time link, chooses a password with it, and the link is then spent", async () => {
    expect(
      (
        await call(contacts.POST, "POST", {
          as: staff,
          params: { engagementId: String(engagement) },
          body: { name: "Carla Mendes", email: "carla@client-a.example" },
        })
      ).status,
    ).toBe(403);
    const r = await call(contacts.POST, "POST", {
      as: senior,
      params: { engagementId: String(engagement) },
      body: { name: "Carla Mendes", email: "Carla@Client-A.example" },
    });
    expect(r.status).toBe(201);
    expect(r.json.contact).toMatchObject({
      name: "Carla Mendes",
      email: "carla@client-a.example",
      invitationSent: true,
    });
    carla = { userId: r.json.contact.userId, email: "carla@client-a.example" };
    const user = await getDb()("users").where({ id: carla.userId }).first();
    expect(user).toMatchObject({ grade: "client", firm_role: "member" });
    expect(
      await getDb()("engagement_members").where({ engagement_id: engagement, user_id: carla.userId }).first("role"),
    ).toEqual({ role: "client" });

    const mail = await waitForMessage(addressedTo(carla.email));
    expect(mail.subject).toMatch(/invites you to share audit evidence/);
    const token = /\/invitation\/([A-Za-z0-9_-]+)/.exec(mail.text)?.[1];
    expect(token).toBeTruthy();
    expect(
      (await call(invitation.POST, "POST", { as: null, params: { token: token! }, body: { password: "short" } }))
        .status,
    ).toBe(400);
    const ok = await call(invitation.POST, "POST", {
      as: null,
      params: { token: token! },
      body: { password: "carla-chooses-this-1" },
    });
    expect(ok).toMatchObject({ status: 200, json: { email: carla.email } });
    const stored = (await getDb()("users").where({ id: carla.userId }).first("password_hash"))!;
    expect(await bcrypt.compare("carla-chooses-this-1", stored.password_hash)).toBe(true);
    expect(
      (
        await call(invitation.POST, "POST", {
          as: null,
          params: { token: token! },
          body: { password: "someone-else-again" },
        })
      ).status,
    ).toBe(404);
    expect(await auditCount({ entity: "user_invitation", action: "accept" })).toBeGreaterThanOrEqual(1);
  });

  it("refuses an e-mail that belongs to an auditor, and lists the contacts", async () => {
    const auditorEmail = (await getDb()("users").where({ id: staff }).first("email"))!.email;
    const r = await call(contacts.POST, "POST", {
      as: senior,
      params: { engagementId: String(engagement) },
      body: { name: "Not a client", email: auditorEmail },
    });
    expect(r.status).toBe(409);
    const listed = await call(contacts.GET, "GET", { as: staff, params: { engagementId: String(engagement) } });
    expect(listed.json.contacts.map((c: { userId: number }) => c.userId).sort()).toEqual(
      [otherClient, carla.userId].sort(),
    );
  });
});

describe("request lists", () => {
  let listId: number, shownListId: number;

  it("are created by a senior from the drawn sample and e-mailed to the contact with a link", async () => {
    expect((await createList(staff, { contactUserId: carla.userId })).status).toBe(403);
    const bad = await createList(senior, { contactUserId: staff, dueDate: "2020-01-01", needs: ["other"] });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.json.error.fields).sort()).toEqual(["needsNote"]);
    const notContact = await createList(senior, { contactUserId: staff });
    expect(notContact.status).toBe(400);
    expect(notContact.json.error.fields.contactUserId[0]).toMatch(/client contact/);

    const r = await createList(senior, {
      contactUserId: carla.userId,
      items: [items[0].id, items[1].id, items[2].id],
      needsNote: "Remittance advice showing the bank reference",
      message: "Thank you for your help.",
    });
    expect(r.status).toBe(201);
    listId = r.json.requestList.id;
    expect(r.json.requestList).toMatchObject({ itemCount: 3, showBookValues: false, status: "open" });
    const mail = await waitForMessage(addressedTo(carla.email));
    expect(mail.subject).toMatch(/Documents requested: Receivables — supporting documents/);
    expect(mail.text).toContain(`/requests/${listId}`);
    expect(mail.text).toContain("Thank you for your help.");
    expect(await auditCount({ entity: "request_list", entity_id: String(listId), action: "create" })).toBe(1);

    const shown = await createList(senior, {
      title: "With amounts",
      contactUserId: carla.userId,
      items: [items[3].id],
      showBookValues: true,
    });
    shownListId = shown.json.requestList.id;
  });

  it("show the client only their own lists, without book values unless the list shows them", async () => {
    const mine = await call(myLists.GET, "GET", { as: carla.userId });
    expect(mine.json.requestLists.map((l: { id: number }) => l.id).sort()).toEqual([listId, shownListId].sort());
    expect((await call(myLists.GET, "GET", { as: otherClient })).json.requestLists).toEqual([]);

    const hidden = await clientView(carla.userId, listId);
    expect(hidden.status).toBe(200);
    expect(hidden.json.items.map((i: { itemRef: string }) => i.itemRef)).toEqual(
      items.slice(0, 3).map((i) => i.itemRef),
    );
    for (const item of hidden.json.items) expect(item).not.toHaveProperty("bookValue");
    const body = JSON.stringify(hidden.json);
    for (const i of items.slice(0, 3)) expect(body).not.toContain(`"${i.bookValue}"`);
    expect(hidden.json.items[0]).toMatchObject({
      status: "requested",
      needs: ["invoice", "remittance"],
      needsNote: "Remittance advice showing the bank reference",
    });

    const shown = await clientView(carla.userId, shownListId);
    expect(shown.json.items[0].bookValue).toBe(items[3].bookValue);

    expect((await clientView(otherClient, listId)).status).toBe(404);
    expect((await clientView(senior, listId)).status).toBe(404);
    expect((await clientView(carla.userId, 999999)).status).toBe(404);
  });

  it("take several files per item from the client, typed by content, and a note; the item becomes provided", async () => {
    const { json } = await clientView(carla.userId, listId);
    const [first, second] = json.items;
    const a = await clientUpload(carla.userId, listId, first.id, "INV-remittance.pdf", PDF);
    const b = await clientUpload(carla.userId, listId, first.id, "remittance.csv", CSV);
    expect([a.status, b.status]).toEqual([201, 201]);
    expect(a.json.file).toMatchObject({ contentType: "application/pdf", sha256: sha(PDF), itemStatus: "provided" });
    const exe = await clientUpload(
      carla.userId,
      listId,
      first.id,
      "invoice.pdf",
      new Uint8Array([0x4d, 0x5a, 0x90, 0x00, 0x03, 0x00]),
    );
    expect(exe.status).toBe(415);
    expect((await clientUpload(otherClient, listId, first.id, "x.pdf", PDF)).status).toBe(404);
    const strayItem = (await clientView(carla.userId, shownListId)).json.items[0].id;
    expect((await clientUpload(carla.userId, listId, strayItem, "x.pdf", PDF)).status).toBe(404);

    expect(
      (
        await call(myItem.PATCH, "PATCH", {
          as: carla.userId,
          params: { listId: String(listId), requestItemId: String(second.id) },
          body: { note: "This invoice was cancelled; credit note to follow." },
        })
      ).status,
    ).toBe(204);
    const after = await clientView(carla.userId, listId);
    expect(after.json.items[0]).toMatchObject({ status: "provided" });
    expect(after.json.items[0].files.map((f: { fileName: string }) => f.fileName)).toEqual([
      "INV-remittance.pdf",
      "remittance.csv",
    ]);
    expect(after.json.items[1]).toMatchObject({
      status: "requested",
      clientNote: "This invoice was cancelled; credit note to follow.",
    });

    const download = await callRaw(myFile.GET, "GET", {
      as: carla.userId,
      params: { listId: String(listId), fileId: String(a.json.file.id) },
    });
    expect(sha(new Uint8Array(await download.arrayBuffer()))).toBe(sha(PDF));
    expect(await auditCount({ entity: "request_file", action: "client-upload", engagement_id: engagement })).toBe(2); // this file's engagement: client-access-matrix.test.ts uploads too, and the suite shares one database
  });

  it("let the team send a file back with a reason (e-mailed to the client) and accept another, which becomes evidence", async () => {
    const team = await call(teamList.GET, "GET", { as: staff, params: sp({ listId: String(listId) }) });
    expect(team.json.items[0].bookValue).toBe(items[0].bookValue);
    const [pdf, csv] = team.json.items[0].files;
    const teamDownload = await callRaw(teamFile.GET, "GET", {
      as: staff,
      params: sp({ listId: String(listId), fileId: String(pdf.id) }),
    });
    expect(teamDownload.headers.get("x-content-sha256")).toBe(sha(PDF));

    const fileParams = (id: number) => sp({ listId: String(listId), fileId: String(id) });
    expect(
      (await call(sendBack.POST, "POST", { as: staff, params: fileParams(csv.id), body: { reason: "no" } })).status,
    ).toBe(400);
    const returned = await call(sendBack.POST, "POST", {
      as: staff,
      params: fileParams(csv.id),
      body: { reason: "The extract does not show the payment date; please send the bank statement line." },
    });
    expect(returned.json).toMatchObject({ itemStatus: "provided", mailSent: true });
    // Matched by subject: the outbox may deliver an earlier step's message to the same person later.
    const mail = await waitForMessage((m) => addressedTo(carla.email)(m) && m.subject.startsWith("More needed for"));
    expect(mail.subject).toBe(`More needed for ${items[0].itemRef} (Receivables — supporting documents)`);
    expect(mail.text).toContain("does not show the payment date");

    const accepted = await call(accept.POST, "POST", { as: staff, params: fileParams(pdf.id) });
    expect(accepted.status).toBe(200);
    expect(accepted.json.itemStatus).toBe("accepted");
    expect((await call(accept.POST, "POST", { as: staff, params: fileParams(pdf.id) })).status).toBe(409);

    const evidence = await call(evidenceList.GET, "GET", { as: staff, params: sp({ itemId: String(items[0].id) }) });
    expect(evidence.json.evidence).toEqual([
      expect.objectContaining({
        id: accepted.json.evidenceId,
        fileName: "INV-remittance.pdf",
        sha256: sha(PDF),
        uploadedById: carla.userId,
      }),
    ]);
    const rows = await getDb()("request_files as f")
      .join("item_evidence as e", "e.id", "f.evidence_id")
      .where("f.id", pdf.id)
      .first("f.object_key as a", "e.object_key as b");
    expect(rows.a).toBe(rows.b);

    const grid = await listSampleItems(staff, engagement, sampleId);
    expect(grid.find((i) => i.id === items[0].id)).toMatchObject({ requestStatus: "accepted", evidenceCount: 1 });
    expect(grid.find((i) => i.id === items[1].id)).toMatchObject({ requestStatus: "requested", evidenceCount: 0 });
    expect(grid.find((i) => i.id === items[5].id)).toMatchObject({ requestStatus: null });

    const again = await clientUpload(carla.userId, listId, team.json.items[0].id, "more.pdf", PDF);
    expect(again.status).toBe(409);
    expect(again.json.error.message).toMatch(/already accepted/);
    expect(await auditCount({ entity: "request_file", entity_id: String(pdf.id), action: "accept" })).toBe(1);
    expect(await auditCount({ entity: "item_evidence", action: "accept-client-file" })).toBe(1);
  });

  it("send one daily digest of overdue items to the client and the senior, once a day", async () => {
    await getDb()("request_lists").where({ id: listId }).update({ due_date: "2026-11-20" });
    const first = await runRequestReminders(getDb(), { today: "2026-11-25" });
    expect(first.lists).toBe(1);
    expect(first.messages.every((m) => m.sent)).toBe(true);
    const toClient = await waitForMessage((m) => addressedTo(carla.email)(m) && m.subject.startsWith("Reminder:"));
    const toSenior = await waitForMessage(
      (m) => addressedTo(seniorEmail)(m) && m.subject.startsWith("Client requests overdue:"),
    );
    expect(toClient.subject).toBe("Reminder: 2 requested items overdue");
    expect(toSenior.subject).toBe("Client requests overdue: 2 items");
    // item 1 was accepted; items 2 and 3 still await the client
    for (const m of [toClient, toSenior]) {
      expect(m.text).toContain(items[1].itemRef);
      expect(m.text).toContain(items[2].itemRef);
      expect(m.text).not.toContain(`${items[0].itemRef},`);
    }
    expect(toClient.text).toContain(`/requests/${listId}`);
    expect(toSenior.text).toContain(`/samples/${sampleId}/requests/${listId}`);
    const second = await runRequestReminders(getDb(), { today: "2026-11-25" });
    expect(second).toEqual({ lists: 0, messages: [] });
    expect(await auditCount({ entity: "request_list", entity_id: String(listId), action: "overdue-reminder" })).toBe(1);
    expect((await runRequestReminders(getDb(), { today: "2026-11-26" })).lists).toBe(1);
  });

  it("close when the sample is locked: the client's uploads get 409 with a clear message", async () => {
    for (const it of await listSampleItems(staff, engagement, sampleId)) {
      if (it.status === "not-started")
        await saveResult(staff, engagement, sampleId, it.id, {
          version: it.version,
          status: "done",
          auditedValue: it.bookValue,
        });
    }
    expect((await concludeSample(staff, engagement, sampleId)).status).toBe(200);
    expect((await call(signOff.POST, "POST", { as: staff, params: sp(), body: { as: "preparer" } })).status).toBe(200);
    expect((await call(signOff.POST, "POST", { as: manager, params: sp(), body: { as: "reviewer" } })).status).toBe(
      200,
    );
    expect((await call(lock.POST, "POST", { as: manager, params: sp() })).status).toBe(200);

    const view = await clientView(carla.userId, listId);
    expect(view.json.list).toMatchObject({
      status: "closed",
      closedReason: "The sample was locked: its workpaper is final.",
    });
    const refused = await clientUpload(carla.userId, listId, view.json.items[1].id, "late.pdf", PDF);
    expect(refused.status).toBe(409);
    expect(refused.json.error.message).toMatch(
      /This request list is closed \(The sample was locked: its workpaper is final\)/,
    );
    expect(
      (
        await call(myItem.PATCH, "PATCH", {
          as: carla.userId,
          params: { listId: String(listId), requestItemId: String(view.json.items[1].id) },
          body: { note: "late" },
        })
      ).status,
    ).toBe(409);
    expect(await auditCount({ entity: "request_list", action: "close" })).toBe(2);
    expect((await createList(senior, { contactUserId: carla.userId })).status).toBe(409);
    const inbox = await readInbox();
    expect(inbox.some((m) => addressedTo(carla.email)(m) && /locked/i.test(m.subject))).toBe(false);
    // Issue 19: the contact is told each list the lock closed (not the team's lock notice itself).
    const closed = await waitForMessage(
      (m) =>
        addressedTo(carla.email)(m) &&
        /^Request list closed: /.test(m.subject) &&
        m.text.includes(`/requests/${listId}`),
    );
    expect(closed.text.replace(/\s+/g, " ")).toContain("no longer takes files on it");
  });
});
