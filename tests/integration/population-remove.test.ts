import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { call } from "./support/call";
import { auditCount, makeEngagement, makeFirm, makeUser } from "./support/factory";
import { loadCanonicalPopulation, planSample } from "./support/samples";
import * as one from "@/app/api/engagements/[engagementId]/populations/[populationId]/route";
import * as archive from "@/app/api/engagements/[engagementId]/populations/[populationId]/archive/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

// Issue 19: a mistaken population is kept out of the way — deleted when nobody used it, archived when a sample did.
let senior: number, staff: number, engagement: number;
const p = (populationId: number) => ({ engagementId: String(engagement), populationId: String(populationId) });

beforeAll(async () => {
  const firm = await makeFirm();
  const manager = await makeUser(firm, "manager");
  [senior, staff] = await Promise.all([makeUser(firm, "senior"), makeUser(firm, "staff")]);
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
    [staff, "staff"],
  ]);
});

afterAll(async () => {
  await getDb().destroy();
});

describe("deleting and archiving a population", () => {
  it("deletes an unused population with its items and an audit row; staff may not", async () => {
    const { populationId } = await loadCanonicalPopulation(senior, engagement);
    expect((await call(one.DELETE, "DELETE", { as: staff, params: p(populationId) })).status).toBe(403);
    const r = await call(one.DELETE, "DELETE", { as: senior, params: p(populationId) });
    expect(r.status).toBe(204);
    expect(await getDb()("populations").where({ id: populationId }).first()).toBeUndefined();
    expect(
      Number((await getDb()("population_items").where({ population_id: populationId }).count({ n: "*" }).first())?.n),
    ).toBe(0);
    expect(await auditCount({ entity: "population", entity_id: String(populationId), action: "delete" })).toBe(1);
    expect((await call(one.GET, "GET", { as: senior, params: p(populationId) })).status).toBe(404);
  });

  it("refuses to delete a population a sample uses, naming the sample, and archives it instead", async () => {
    const { populationId } = await loadCanonicalPopulation(senior, engagement);
    expect(
      (
        await planSample(senior, engagement, {
          populationId,
          name: "Uses the population",
          params: { method: "mus", tolerableMisstatement: "15000", factorMode: "table" },
        })
      ).status,
    ).toBe(201);
    const refused = await call(one.DELETE, "DELETE", { as: senior, params: p(populationId) });
    expect(refused.status).toBe(409);
    expect(refused.json.error.message).toContain("archive it instead");
    expect(await getDb()("populations").where({ id: populationId }).first()).toBeDefined();

    const archived = await call(archive.POST, "POST", {
      as: senior,
      params: p(populationId),
      body: { archived: true },
    });
    expect(archived.status).toBe(200);
    expect(archived.json.population.archivedAt).toMatch(/^\d{4}-\d{2}-\d{2}T/);
    expect(await auditCount({ entity: "population", entity_id: String(populationId), action: "archive" })).toBe(1);
    const restored = await call(archive.POST, "POST", {
      as: senior,
      params: p(populationId),
      body: { archived: false },
    });
    expect(restored.json.population.archivedAt).toBeNull();
    expect(
      (await call(archive.POST, "POST", { as: senior, params: p(populationId), body: { archived: "yes" } })).status,
    ).toBe(400);
  });
});
