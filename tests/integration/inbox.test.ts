import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { call } from "./support/call";
import { makeEngagement, makeFirm, makeUser } from "./support/factory";
import {
  concludeSample,
  drawSample,
  listSampleItems,
  loadCanonicalPopulation,
  planSample,
  saveResult,
} from "./support/samples";
import * as inbox from "@/app/api/me/inbox/route";
import * as signOff from "@/app/api/engagements/[engagementId]/samples/[sampleId]/sign-off/route";
import * as notes from "@/app/api/engagements/[engagementId]/samples/[sampleId]/notes/route";
import * as answer from "@/app/api/engagements/[engagementId]/samples/[sampleId]/notes/[noteId]/answer/route";
import * as clear from "@/app/api/engagements/[engagementId]/samples/[sampleId]/notes/[noteId]/clear/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

// Issue 19: the reviewer's inbox — what waits for whom as a sample moves through review.
let staff: number,
  senior: number,
  manager: number,
  outsider: number,
  client: number,
  engagement: number,
  sampleId: number;
const p = () => ({ engagementId: String(engagement), sampleId: String(sampleId) });
const read = async (as: number) =>
  (await call(inbox.GET, "GET", { as, params: {} })).json as {
    entries: { sampleId: number; reason: string; notes: number }[];
    counts: Record<string, number>;
  };

beforeAll(async () => {
  const firm = await makeFirm();
  [staff, senior, manager, outsider, client] = await Promise.all([
    makeUser(firm, "staff"),
    makeUser(firm, "senior"),
    makeUser(firm, "manager"),
    makeUser(firm, "manager"),
    makeUser(firm, "client"),
  ]);
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
    [staff, "staff"],
  ]);
  const { populationId } = await loadCanonicalPopulation(senior, engagement);
  sampleId = (
    await planSample(senior, engagement, {
      populationId,
      params: { method: "mus", tolerableMisstatement: "15000", factorMode: "table" },
    })
  ).json.sample.id;
  await drawSample(senior, engagement, sampleId, 4242);
  for (const it of await listSampleItems(staff, engagement, sampleId))
    await saveResult(staff, engagement, sampleId, it.id, {
      version: it.version,
      status: "done",
      auditedValue: it.bookValue,
    });
  expect((await concludeSample(staff, engagement, sampleId)).status).toBe(200);
});

afterAll(async () => {
  await getDb().destroy();
});

describe("GET /api/me/inbox", () => {
  it("is empty before anyone signs off, and refused to client contacts", async () => {
    expect((await read(manager)).counts.total).toBe(0);
    expect((await call(inbox.GET, "GET", { as: client, params: {} })).status).toBe(403);
  });

  it("shows the manager a preparer's sign-off to review, and nothing to people off the engagement", async () => {
    expect((await call(signOff.POST, "POST", { as: staff, params: p(), body: { as: "preparer" } })).status).toBe(200);
    const m = await read(manager);
    expect(m.entries).toEqual([expect.objectContaining({ sampleId, reason: "review", notes: 0 })]);
    expect(m.counts).toMatchObject({ review: 1, total: 1 });
    expect((await read(outsider)).counts.total).toBe(0);
    expect((await read(staff)).counts.total).toBe(0);
  });

  it("shows the preparers an open note to answer, then the manager the answer to clear", async () => {
    const raised = await call(notes.POST, "POST", {
      as: manager,
      params: p(),
      body: { text: "Explain the confirmation differences." },
    });
    expect(raised.status).toBe(201);
    const noteId = String(raised.json.notes.at(-1).id);
    expect((await read(staff)).entries).toEqual([expect.objectContaining({ reason: "answer", notes: 1 })]);
    expect((await read(senior)).counts.answer).toBe(1);
    expect((await read(manager)).counts.answer).toBe(0); // the one who raised it is not asked to answer it
    expect(
      (
        await call(answer.POST, "POST", {
          as: staff,
          params: { ...p(), noteId },
          body: { answer: "Timing only;\nsee the remittances." },
        })
      ).status,
    ).toBe(200);
    expect((await read(staff)).counts.answer).toBe(0);
    expect((await read(manager)).entries.map((e) => e.reason).sort()).toEqual(["clear", "review"]);
    expect((await call(clear.POST, "POST", { as: manager, params: { ...p(), noteId }, body: {} })).status).toBe(200);
    expect((await read(manager)).counts).toMatchObject({ clear: 0, review: 1 });
  });

  it("moves the sample to 'lock' once the reviewer signs off", async () => {
    expect((await call(signOff.POST, "POST", { as: manager, params: p(), body: { as: "reviewer" } })).status).toBe(200);
    expect((await read(manager)).entries).toEqual([expect.objectContaining({ sampleId, reason: "lock" })]);
  });
});
