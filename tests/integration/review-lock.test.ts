import { createHash } from "node:crypto";
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { runMailWorkerDuringTests } from "./support/mail-worker";
import { call, callRaw } from "./support/call";
import { makeEngagement, makeFirm, makeUser } from "./support/factory";
import { addressedTo, waitForMessage } from "./support/inbox";
import {
  drawSample,
  listSampleItems,
  loadCanonicalPopulation,
  planSample,
  saveResult,
  concludeSample,
} from "./support/samples";
import * as one from "@/app/api/engagements/[engagementId]/samples/[sampleId]/route";
import * as draw from "@/app/api/engagements/[engagementId]/samples/[sampleId]/draw/route";
import * as reperform from "@/app/api/engagements/[engagementId]/samples/[sampleId]/reperform/route";
import * as extend from "@/app/api/engagements/[engagementId]/samples/[sampleId]/extend/route";
import * as replace from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/[itemId]/replace/route";
import * as item from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/[itemId]/route";
import * as signOff from "@/app/api/engagements/[engagementId]/samples/[sampleId]/sign-off/route";
import * as notes from "@/app/api/engagements/[engagementId]/samples/[sampleId]/notes/route";
import * as answer from "@/app/api/engagements/[engagementId]/samples/[sampleId]/notes/[noteId]/answer/route";
import * as clear from "@/app/api/engagements/[engagementId]/samples/[sampleId]/notes/[noteId]/clear/route";
import * as lock from "@/app/api/engagements/[engagementId]/samples/[sampleId]/lock/route";
import * as unlock from "@/app/api/engagements/[engagementId]/samples/[sampleId]/unlock/route";
import * as workpaper from "@/app/api/engagements/[engagementId]/samples/[sampleId]/workpaper/route";
import * as audit from "@/app/api/engagements/[engagementId]/samples/[sampleId]/audit/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let staff: number,
  senior: number,
  manager: number,
  partner: number,
  engagement: number,
  populationId: number,
  sampleId: number;
let managerEmail: string, staffEmail: string;
const p = (extra: Record<string, string> = {}) => ({
  engagementId: String(engagement),
  sampleId: String(sampleId),
  ...extra,
});

beforeAll(async () => {
  const firm = await makeFirm();
  [staff, senior, manager, partner] = await Promise.all([
    makeUser(firm, "staff"),
    makeUser(firm, "senior"),
    makeUser(firm, "manager"),
    makeUser(firm, "partner"),
  ]);
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [partner, "partner"],
    [senior, "senior"],
    [staff, "staff"],
  ]);
  [managerEmail, staffEmail] = await Promise.all(
    [manager, staff].map(async (id) => (await getDb()("users").where({ id }).first("email"))!.email),
  );
  populationId = (await loadCanonicalPopulation(senior, engagement)).populationId;
  sampleId = (
    await planSample(senior, engagement, {
      populationId,
      params: { method: "mus", tolerableMisstatement: "15000", factorMode: "table" },
    })
  ).json.sample.id;
  await drawSample(senior, engagement, sampleId, 1206281);
});

afterAll(async () => {
  await getDb().destroy();
});

// Registered after the afterAll above: vitest runs after-hooks in reverse, so the worker stops before the pool closes.
runMailWorkerDuringTests();

async function recordEverything() {
  for (const it of await listSampleItems(staff, engagement, sampleId)) {
    if (it.status !== "not-started") continue;
    await saveResult(staff, engagement, sampleId, it.id, {
      version: it.version,
      status: "done",
      auditedValue: it.itemRef === "INV011" ? "3690.00" : it.bookValue,
      cause: it.itemRef === "INV011" ? "cut-off" : null,
    });
  }
}

describe("sign-offs", () => {
  it("needs every item to have a result before the preparer signs off", async () => {
    const r = await call(signOff.POST, "POST", { as: staff, params: p(), body: { as: "preparer" } });
    expect(r.status).toBe(409);
    expect(r.json.error.message).toMatch(/no result yet/);
  });

  it("needs the auditor's conclusion (and response where called for) before the preparer signs off", async () => {
    await recordEverything();
    const r = await call(signOff.POST, "POST", { as: staff, params: p(), body: { as: "preparer" } });
    expect(r.status).toBe(409);
    expect(r.json.error.message).toMatch(/auditor's conclusion/);
  });

  it("lets staff sign off as preparer, e-mails the reviewers, and refuses a manager as preparer", async () => {
    expect((await concludeSample(staff, engagement, sampleId)).status).toBe(200);
    expect((await call(signOff.POST, "POST", { as: manager, params: p(), body: { as: "preparer" } })).status).toBe(403);
    const r = await call(signOff.POST, "POST", { as: staff, params: p(), body: { as: "preparer" } });
    expect(r.status).toBe(200);
    expect(r.json.review.preparer).toMatchObject({ role: "staff" });
    const mail = await waitForMessage((m) => addressedTo(managerEmail)(m) && /ready for review/i.test(m.subject));
    expect(mail.text).toContain(`/engagements/${engagement}/samples/${sampleId}`);
  });

  it("clears the sign-offs when a result changes afterwards, and says so", async () => {
    const [first] = await listSampleItems(staff, engagement, sampleId);
    const r = await saveResult(staff, engagement, sampleId, first.id, {
      version: first.version,
      status: "done",
      auditedValue: first.bookValue,
      comment: "Re-checked",
    });
    expect(r.json.signOffsCleared).toBe(true);
    const view = await call(one.GET, "GET", { as: staff, params: p() });
    expect(view.json.review.preparer).toBeNull();
    // The auditor's conclusion went with them (issue 13 §6): the preparer records it again.
    expect((await call(signOff.POST, "POST", { as: staff, params: p(), body: { as: "preparer" } })).status).toBe(409);
    expect((await concludeSample(staff, engagement, sampleId)).status).toBe(200);
    expect((await call(signOff.POST, "POST", { as: staff, params: p(), body: { as: "preparer" } })).status).toBe(200);
  });
});

describe("review notes", () => {
  let noteId: number;
  it("are raised by a reviewer only, and block the reviewer's sign-off until cleared", async () => {
    expect((await call(notes.POST, "POST", { as: senior, params: p(), body: { text: "Explain INV011" } })).status).toBe(
      403,
    );
    const raised = await call(notes.POST, "POST", {
      as: manager,
      params: p(),
      body: { text: "Explain the cut-off difference on INV011 <b>and</b> attach the dispatch note." },
    });
    expect(raised.status).toBe(201);
    noteId = raised.json.notes[0].id;
    await waitForMessage((m) => addressedTo(staffEmail)(m) && /note/i.test(m.subject));
    const blocked = await call(signOff.POST, "POST", { as: manager, params: p(), body: { as: "reviewer" } });
    expect(blocked.status).toBe(409);
    expect(blocked.json.error.message).toMatch(/not cleared/);
    expect((await call(clear.POST, "POST", { as: manager, params: p({ noteId: String(noteId) }) })).status).toBe(409); // not answered yet
  });

  it("are answered by the preparer and cleared by the reviewer, who can then sign off", async () => {
    expect(
      (
        await call(answer.POST, "POST", {
          as: staff,
          params: p({ noteId: String(noteId) }),
          body: { answer: "Goods shipped 2 October; invoice belongs to the next period." },
        })
      ).status,
    ).toBe(200);
    await waitForMessage((m) => addressedTo(managerEmail)(m) && /answered/i.test(m.subject));
    expect((await call(clear.POST, "POST", { as: staff, params: p({ noteId: String(noteId) }) })).status).toBe(403);
    const cleared = await call(clear.POST, "POST", { as: manager, params: p({ noteId: String(noteId) }) });
    expect(cleared.json.notes[0]).toMatchObject({ status: "cleared", answer: expect.stringContaining("2 October") });
    expect((await call(signOff.POST, "POST", { as: senior, params: p(), body: { as: "reviewer" } })).status).toBe(403);
    const r = await call(signOff.POST, "POST", { as: manager, params: p(), body: { as: "reviewer" } });
    expect(r.json.review.reviewer).toMatchObject({ role: "manager" });
  });
});

describe("lock", () => {
  let storedSha: string;
  it("is refused to a senior, and renders and stores the workpaper once for a manager", async () => {
    expect((await call(lock.POST, "POST", { as: senior, params: p() })).status).toBe(403);
    const r = await call(lock.POST, "POST", { as: manager, params: p() });
    expect(r.status).toBe(200);
    storedSha = r.json.locked.sha256;
    expect(r.json.review.lock).toMatchObject({ workpaperSha256: storedSha });
    await waitForMessage((m) => addressedTo(staffEmail)(m) && /locked/i.test(m.subject));
  });

  it("serves exactly the stored bytes, whose text carries the sample's numbers", async () => {
    const first = Buffer.from(await (await callRaw(workpaper.GET, "GET", { as: staff, params: p() })).arrayBuffer());
    const second = Buffer.from(await (await callRaw(workpaper.GET, "GET", { as: staff, params: p() })).arrayBuffer());
    expect(createHash("sha256").update(first).digest("hex")).toBe(storedSha);
    expect(second.equals(first)).toBe(true);
    const file = path.join(os.tmpdir(), `wp-${sampleId}.pdf`);
    fs.writeFileSync(file, first);
    const text = execFileSync("pdftotext", ["-layout", file, "-"]).toString();
    expect(text).toContain("1206281"); // the seed
    expect(text).toContain("5952c03fa993e6c3f9ced11c4e18a47b10b687fbc16908b3cb70ac257f133a0e");
    expect(text).toContain("INV011");
    expect(text).not.toMatch(/DRAFT/);
  });

  it("answers every kind of write with 409 locked", async () => {
    const items = await listSampleItems(staff, engagement, sampleId);
    const writes: [string, () => Promise<{ status: number; json: { error?: { code: string } } }>][] = [
      [
        "replan",
        () =>
          call(one.PATCH, "PATCH", {
            as: senior,
            params: p(),
            body: {
              populationId,
              name: "Changed",
              objective: "Changed objective",
              assertion: "Existence",
              direction: "overstatement",
              params: { method: "mus" },
            },
          }),
      ],
      ["redraw", () => call(draw.POST, "POST", { as: senior, params: p(), body: { seed: 1 } })],
      ["re-perform", () => call(reperform.POST, "POST", { as: staff, params: p() })],
      [
        "extend",
        () => call(extend.POST, "POST", { as: senior, params: p(), body: { additional: 1, reason: "More work" } }),
      ],
      [
        "replace",
        () =>
          call(replace.POST, "POST", {
            as: senior,
            params: p({ itemId: String(items[0].id) }),
            body: { reason: "Voided" },
          }),
      ],
      [
        "record a result",
        () =>
          call(item.PATCH, "PATCH", {
            as: staff,
            params: p({ itemId: String(items[0].id) }),
            body: { version: items[0].version, status: "done", auditedValue: "1.00" },
          }),
      ],
      ["preparer sign-off", () => call(signOff.POST, "POST", { as: staff, params: p(), body: { as: "preparer" } })],
      ["reviewer sign-off", () => call(signOff.POST, "POST", { as: manager, params: p(), body: { as: "reviewer" } })],
      ["raise a note", () => call(notes.POST, "POST", { as: manager, params: p(), body: { text: "One more thing" } })],
      ["lock again", () => call(lock.POST, "POST", { as: manager, params: p() })],
    ];
    for (const [what, write] of writes) {
      const r = await write();
      expect({ what, status: r.status, code: r.json.error?.code }).toEqual({
        what,
        status: 409,
        code: expect.stringMatching(/locked|conflict/),
      });
    }
    // the replan conflict is "drawn"; every other write names the lock
    const redraw = await call(draw.POST, "POST", { as: senior, params: p(), body: { seed: 1 } });
    expect(redraw.json.error.code).toBe("locked");
  });

  it("unlocks only for a partner with a reason, and the trail shows lock and unlock", async () => {
    expect(
      (
        await call(unlock.POST, "POST", {
          as: manager,
          params: p(),
          body: { reason: "Need to fix a typo in a comment" },
        })
      ).status,
    ).toBe(403);
    expect((await call(unlock.POST, "POST", { as: partner, params: p(), body: { reason: "short" } })).status).toBe(400);
    const r = await call(unlock.POST, "POST", {
      as: partner,
      params: p(),
      body: { reason: "Client sent revised dispatch records" },
    });
    expect(r.json.review).toMatchObject({ lock: null, reviewer: null });
    const trail = await call(audit.GET, "GET", { as: staff, params: p(), query: { kind: "lock" } });
    expect(trail.json.entries.map((e: { action: string }) => e.action)).toEqual(["unlock", "lock"]);
    expect(trail.json.entries[0].after.reason).toBe("Client sent revised dispatch records");
    const byStaff = await call(audit.GET, "GET", { as: staff, params: p(), query: { userId: String(staff) } });
    expect(byStaff.json.entries.length).toBeGreaterThan(0);
    expect(byStaff.json.entries.every((e: { actorId: number }) => e.actorId === staff)).toBe(true);
    const draft = await callRaw(workpaper.GET, "GET", { as: staff, params: p() });
    const file = path.join(os.tmpdir(), `wp-draft-${sampleId}.pdf`);
    fs.writeFileSync(file, Buffer.from(await draft.arrayBuffer()));
    expect(execFileSync("pdftotext", [file, "-"]).toString()).toMatch(/DRAFT/);
  });
});
