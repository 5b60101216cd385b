import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { call } from "./support/call";
import { auditCount, json, makeEngagement, makeFirm, makeUser } from "./support/factory";
import * as list from "@/app/api/engagements/route";
import * as one from "@/app/api/engagements/[engagementId]/route";
import * as members from "@/app/api/engagements/[engagementId]/members/route";
import * as member from "@/app/api/engagements/[engagementId]/members/[userId]/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

const newEngagement = {
  clientName: "Kestrel Ridge Cooperative",
  name: "Year-end audit",
  periodEnd: "2026-12-31",
  currency: "USD",
  overallMateriality: "250000",
  performanceMateriality: "187500",
};

let firm: number, manager: number, partner: number, staff: number, senior: number, outsider: number, inactive: number;
let engagementA: number, engagementB: number;

beforeAll(async () => {
  firm = await makeFirm();
  [manager, partner, staff, senior, outsider] = await Promise.all([
    makeUser(firm, "manager"),
    makeUser(firm, "partner"),
    makeUser(firm, "staff"),
    makeUser(firm, "senior"),
    makeUser(firm, "manager"),
  ]);
  inactive = await makeUser(firm, "manager", { active: false });
  engagementA = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [staff, "staff"],
    [senior, "senior"],
    [inactive, "manager"],
  ]);
  engagementB = await makeEngagement(firm, outsider, [
    [outsider, "manager"],
    [partner, "partner"],
  ]);
});

afterAll(async () => {
  await getDb().destroy();
});

describe("GET /api/engagements", () => {
  it("lists only the caller's engagements with their role", async () => {
    const r = await call(list.GET, "GET", { as: staff });
    expect(r.status).toBe(200);
    expect(r.json.engagements.map((e: { id: number }) => e.id)).toEqual([engagementA]);
    expect(r.json.engagements[0].myRole).toBe("staff");
  });

  it("answers 401 without a session", async () => {
    expect((await call(list.GET, "GET", { as: null })).status).toBe(401);
  });

  it("answers 401 for a deactivated user", async () => {
    expect((await call(list.GET, "GET", { as: inactive })).status).toBe(401);
  });
});

describe("engagement isolation", () => {
  it("gives a member of A 404 on B, for reads and writes alike", async () => {
    const params = { engagementId: String(engagementB) };
    expect((await call(one.GET, "GET", { as: staff, params })).status).toBe(404);
    expect((await call(one.PATCH, "PATCH", { as: manager, params, body: { status: "fieldwork" } })).status).toBe(404);
    expect((await call(members.GET, "GET", { as: manager, params })).status).toBe(404);
    expect(
      (await call(members.POST, "POST", { as: manager, params, body: { userId: staff, role: "staff" } })).status,
    ).toBe(404);
  });

  it("answers 404 for an engagement that does not exist, the same as one the user is not on", async () => {
    const missing = await call(one.GET, "GET", { as: staff, params: { engagementId: "999999" } });
    const hidden = await call(one.GET, "GET", { as: staff, params: { engagementId: String(engagementB) } });
    expect(missing).toEqual(hidden);
  });
});

describe("POST /api/engagements", () => {
  it("lets a manager create one, joining as manager, with audit rows in the same transaction", async () => {
    const before = await auditCount({ entity: "engagement", action: "create" });
    const r = await call(list.POST, "POST", { as: manager, body: newEngagement });
    expect(r.status).toBe(201);
    expect(r.json.engagement).toMatchObject({
      clientName: "Kestrel Ridge Cooperative",
      overallMateriality: "250000.00",
      performanceMateriality: "187500.00",
      status: "planning",
    });
    const id = r.json.engagement.id;
    expect(await auditCount({ entity: "engagement", action: "create" })).toBe(before + 1);
    expect(await auditCount({ entity: "engagement_member", entity_id: `${id}:${manager}`, action: "add" })).toBe(1);
    const team = await call(members.GET, "GET", { as: manager, params: { engagementId: String(id) } });
    expect(team.json.members).toEqual([expect.objectContaining({ userId: manager, role: "manager" })]);
  });

  it("refuses staff and seniors with 403 and writes nothing", async () => {
    const before = await auditCount();
    for (const who of [staff, senior]) {
      const r = await call(list.POST, "POST", { as: who, body: newEngagement });
      expect(r.status).toBe(403);
      expect(r.json.error.message).toMatch(/managers and partners/);
    }
    expect(await auditCount()).toBe(before);
  });

  it("answers 400 for malformed JSON", async () => {
    const r = await call(list.POST, "POST", { as: manager, rawBody: "{ not json" });
    expect(r.status).toBe(400);
    expect(r.json.error.fields).toHaveProperty("body");
  });

  it("answers 400 naming each missing or bad field", async () => {
    const r = await call(list.POST, "POST", {
      as: manager,
      body: { ...newEngagement, clientName: undefined, periodEnd: "2026-13-01" },
    });
    expect(r.status).toBe(400);
    expect(Object.keys(r.json.error.fields).sort()).toEqual(["clientName", "periodEnd"]);
    expect(r.json.error.message).toMatch(/clientName/);
  });
});

describe("PATCH /api/engagements/:id", () => {
  const params = () => ({ engagementId: String(engagementA) });

  it("lets a manager change the status and records before → after", async () => {
    const r = await call(one.PATCH, "PATCH", { as: manager, params: params(), body: { status: "fieldwork" } });
    expect(r.status).toBe(200);
    expect(r.json.engagement.status).toBe("fieldwork");
    const row = (await getDb()("audit_log")
      .where({ entity: "engagement", entity_id: String(engagementA), action: "update" })
      .orderBy("id", "desc")
      .first())!;
    expect(json(row.before_json)).toEqual({ status: "planning" });
    expect(json(row.after_json)).toEqual({ status: "fieldwork" });
  });

  it("refuses a senior with 403", async () => {
    expect(
      (await call(one.PATCH, "PATCH", { as: senior, params: params(), body: { status: "completion" } })).status,
    ).toBe(403);
  });

  it("refuses an empty change with 400", async () => {
    expect((await call(one.PATCH, "PATCH", { as: manager, params: params(), body: {} })).status).toBe(400);
  });
});

describe("team management", () => {
  const params = () => ({ engagementId: String(engagementA) });

  it("adds, re-roles and removes a member, each with an audit row", async () => {
    const newcomer = await makeUser(firm, "staff");
    const add = await call(members.POST, "POST", {
      as: manager,
      params: params(),
      body: { userId: newcomer, role: "staff" },
    });
    expect(add.status).toBe(201);
    const mp = { ...params(), userId: String(newcomer) };
    expect(
      (await call(member.PATCH, "PATCH", { as: manager, params: mp, body: { role: "senior" } })).json.members,
    ).toContainEqual(expect.objectContaining({ userId: newcomer, role: "senior" }));
    expect((await call(member.DELETE, "DELETE", { as: manager, params: mp })).status).toBe(200);
    const actions = await getDb()("audit_log")
      .where({ entity: "engagement_member", entity_id: `${engagementA}:${newcomer}` })
      .orderBy("id")
      .pluck("action");
    expect(actions).toEqual(["add", "change-role", "remove"]);
  });

  it("does not let a manager grant partner", async () => {
    const r = await call(members.POST, "POST", {
      as: manager,
      params: params(),
      body: { userId: partner, role: "partner" },
    });
    expect(r.status).toBe(403);
  });

  it("does not let staff change the team", async () => {
    const r = await call(member.PATCH, "PATCH", {
      as: staff,
      params: { ...params(), userId: String(senior) },
      body: { role: "staff" },
    });
    expect(r.status).toBe(403);
  });

  it("keeps at least one manager or partner", async () => {
    const solo = await makeEngagement(firm, manager, [[manager, "manager"]]);
    const r = await call(member.DELETE, "DELETE", {
      as: manager,
      params: { engagementId: String(solo), userId: String(manager) },
    });
    expect(r.status).toBe(409);
    expect(r.json.error.message).toMatch(/at least one manager or partner/);
  });

  it("refuses a user from another firm with 400 naming userId", async () => {
    const otherFirm = await makeFirm();
    const stranger = await makeUser(otherFirm, "staff");
    const r = await call(members.POST, "POST", {
      as: manager,
      params: params(),
      body: { userId: stranger, role: "staff" },
    });
    expect(r.status).toBe(400);
    expect(r.json.error.fields).toHaveProperty("userId");
  });
});
