import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { call } from "./support/call";
import { auditCount, makeEngagement, makeFirm, makeUser } from "./support/factory";
import { drawSample, listSampleItems, loadCanonicalPopulation, planSample } from "./support/samples";
import * as results from "@/app/api/engagements/[engagementId]/samples/[sampleId]/results/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

// Issue 19: a pasted column, "agreed to book" on selected rows and the undo of the last save all go
// through POST …/results — one transaction with an audit row per item, or nothing, naming the rows.
let staff: number, viewer: number, engagement: number, sampleId: number;
const p = () => ({ engagementId: String(engagement), sampleId: String(sampleId) });

beforeAll(async () => {
  const firm = await makeFirm();
  const [manager, senior] = await Promise.all([makeUser(firm, "manager"), makeUser(firm, "senior")]);
  [staff, viewer] = await Promise.all([makeUser(firm, "staff"), makeUser(firm, "staff")]);
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
    [staff, "staff"],
    [viewer, "viewer"],
  ]);
  const { populationId } = await loadCanonicalPopulation(senior, engagement);
  sampleId = (
    await planSample(senior, engagement, {
      populationId,
      params: { method: "mus", tolerableMisstatement: "15000", factorMode: "table" },
    })
  ).json.sample.id;
  await drawSample(senior, engagement, sampleId, 190190);
});

afterAll(async () => {
  await getDb().destroy();
});

const audits = () => auditCount({ entity: "sample_item", action: "record-result", sample_id: sampleId });

describe("POST …/results", () => {
  it("saves a pasted column in one go, with one audit row per item", async () => {
    const items = (await listSampleItems(staff, engagement, sampleId)).slice(0, 3);
    const before = await audits();
    const pasted = ["100.00", "1,250.50", "0"];
    const r = await call(results.POST, "POST", {
      as: staff,
      params: p(),
      body: {
        rows: items.map((it, i) => ({ itemId: it.id, version: it.version, status: "done", auditedValue: pasted[i] })),
      },
    });
    expect(r.status, JSON.stringify(r.json)).toBe(200);
    expect(r.json.items.map((i: { auditedValue: string }) => i.auditedValue)).toEqual(["100.00", "1250.50", "0.00"]);
    expect(r.json.items.every((i: { version: number }, k: number) => i.version === items[k].version + 1)).toBe(true);
    expect(await audits()).toBe(before + 3);
  });

  it("refuses the whole batch naming each bad row, and changes nothing", async () => {
    const items = (await listSampleItems(staff, engagement, sampleId)).slice(3, 6);
    const before = await audits();
    const rows = [
      { itemId: items[0].id, version: items[0].version, status: "done", auditedValue: "12.00" },
      { itemId: items[1].id, version: items[1].version, status: "done", auditedValue: "twelve" },
      { itemId: items[2].id, version: items[2].version, status: "done", auditedValue: "1.234" },
    ];
    const r = await call(results.POST, "POST", { as: staff, params: p(), body: { rows } });
    expect(r.status).toBe(400);
    expect(r.json.error.message).toContain(
      `Nothing was saved. 2 rows were refused — ${items[1].itemRef}: Audited value:`,
    );
    expect(r.json.error.message).toContain(`${items[2].itemRef}: Audited value:`);
    expect(r.json.error.fields["rows.1"][0]).toMatch(new RegExp(`^${items[1].itemRef}: Audited value`));
    expect(await audits()).toBe(before);
    const after = await listSampleItems(staff, engagement, sampleId);
    expect(after.find((i) => i.id === items[0].id)?.status).toBe("not-started");
  });

  it("rolls back every row when one was changed by someone else since it was read (409 naming it)", async () => {
    const items = (await listSampleItems(staff, engagement, sampleId)).slice(0, 2); // saved above: versions moved on
    const stale = { itemId: items[0].id, version: items[0].version - 1, status: "done", auditedValue: "5.00" };
    const fresh = { itemId: items[1].id, version: items[1].version, status: "done", auditedValue: "6.00" };
    const before = await audits();
    const r = await call(results.POST, "POST", { as: staff, params: p(), body: { rows: [fresh, stale] } });
    expect(r.status).toBe(409);
    expect(r.json.error.message).toContain(items[0].itemRef);
    expect(await audits()).toBe(before);
    expect((await listSampleItems(staff, engagement, sampleId)).find((i) => i.id === items[1].id)?.version).toBe(
      items[1].version,
    );
  });

  it("refuses an item of another draw or sent twice, a viewer, and an empty batch", async () => {
    const [it] = await listSampleItems(staff, engagement, sampleId);
    const row = { itemId: it.id, version: it.version, status: "done", auditedValue: it.bookValue };
    const twice = await call(results.POST, "POST", { as: staff, params: p(), body: { rows: [row, row] } });
    expect(twice.status).toBe(400);
    expect(twice.json.error.message).toContain(`${it.itemRef}: the item appears twice`);
    const foreign = await call(results.POST, "POST", {
      as: staff,
      params: p(),
      body: { rows: [{ ...row, itemId: 2147483000 }] },
    });
    expect(foreign.json.error.message).toContain("item 2147483000: no such item in the current draw");
    expect((await call(results.POST, "POST", { as: viewer, params: p(), body: { rows: [row] } })).status).toBe(403);
    expect((await call(results.POST, "POST", { as: staff, params: p(), body: { rows: [] } })).status).toBe(400);
  });
});
