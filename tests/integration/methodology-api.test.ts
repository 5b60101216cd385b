import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { call } from "./support/call";
import { auditCount, makeEngagement, makeFirm, makeUser } from "./support/factory";
import { loadCanonicalPopulation, planSample } from "./support/samples";
import * as methodology from "@/app/api/firm/methodology/route";
import { DEFAULT_METHODOLOGY, confidenceForFactor, type MethodologySettings } from "@/lib/validation/methodology";
import { getSampleById } from "@/lib/data/samples";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let firm: number, admin: number, manager: number, senior: number, engagement: number;

beforeAll(async () => {
  firm = await makeFirm();
  admin = await makeUser(firm, "staff", { admin: true });
  manager = await makeUser(firm, "manager");
  senior = await makeUser(firm, "senior");
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
  ]);
});

afterAll(async () => {
  await getDb().destroy();
});

const storedVersions = async () =>
  Number((await getDb()("firm_methodology").where({ firm_id: firm }).count({ n: "*" }).first())?.n);

const changed = (): MethodologySettings => ({ ...DEFAULT_METHODOLOGY, classicalDistribution: "t", musLimits: "net" });

describe("firm methodology settings", () => {
  it("answers the shipped defaults as version 0 until the firm saves its own", async () => {
    const r = await call(methodology.GET, "GET", { as: admin });
    expect(r.status).toBe(200);
    expect(r.json.methodology).toMatchObject({ version: 0, updatedBy: null });
    // 1 − e^(−3.0) = 0.9502 (Poisson, zero misstatements; AICPA factor 3.0 ≈ 95 %, common practice)
    expect(r.json.methodology.settings.assuranceFactors[0][0]).toEqual({ factor: 3, confidence: 0.9502 });
    expect(confidenceForFactor(2.3)).toBeCloseTo(0.8997, 4);
  });

  it("refuses everyone but a firm administrator with 403, and writes nothing", async () => {
    for (const as of [manager, senior]) {
      expect((await call(methodology.GET, "GET", { as })).status).toBe(403);
      expect((await call(methodology.PUT, "PUT", { as, body: changed() })).status).toBe(403);
    }
    expect(await storedVersions()).toBe(0);
  });

  it("refuses a bad table naming the cell, and keeps what was stored", async () => {
    const bad = changed();
    bad.assuranceFactors = bad.assuranceFactors.map((row, i) =>
      row.map((cell, j) => (i === 1 && j === 2 ? { ...cell, factor: -1 } : cell)),
    );
    const r = await call(methodology.PUT, "PUT", { as: admin, body: bad });
    expect(r.status).toBe(400);
    expect(Object.keys(r.json.error.fields)).toContain("assuranceFactors.1.2.factor");
    expect(await storedVersions()).toBe(0);
  });

  it("saves a new audited version and stamps the version in force on each plan; a later change leaves the plan alone", async () => {
    const { populationId } = await loadCanonicalPopulation(senior, engagement);
    const before = await planSample(senior, engagement, {
      populationId,
      params: { method: "mus", confidence: 0.95, tolerableMisstatement: "15000", expectedMisstatement: "0" },
    });
    expect(before.status).toBe(201);

    const saved = await call(methodology.PUT, "PUT", { as: admin, body: changed() });
    expect(saved.status).toBe(200);
    expect(saved.json.methodology).toMatchObject({
      version: 1,
      settings: { classicalDistribution: "t", musLimits: "net" },
    });
    expect(await auditCount({ entity: "firm_methodology", entity_id: String(firm), action: "update" })).toBe(1);

    const after = await planSample(senior, engagement, {
      populationId,
      params: { method: "mus", confidence: 0.95, tolerableMisstatement: "15000", expectedMisstatement: "0" },
    });
    const first = await getSampleById(getDb(), { engagementId: engagement, sampleId: before.json.sample.id as number });
    const second = await getSampleById(getDb(), { engagementId: engagement, sampleId: after.json.sample.id as number });
    expect([first.methodologyVersion, first.methodology.musLimits]).toEqual([0, "gross"]);
    expect([second.methodologyVersion, second.methodology.musLimits]).toEqual([1, "net"]);

    await call(methodology.PUT, "PUT", { as: admin, body: { ...changed(), musLimits: "gross" } });
    const again = await getSampleById(getDb(), { engagementId: engagement, sampleId: after.json.sample.id as number });
    expect([again.methodologyVersion, again.methodology.musLimits]).toEqual([1, "net"]);
  });
});
