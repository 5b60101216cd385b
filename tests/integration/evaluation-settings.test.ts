/**
 * Issue 13 §3 and §5: evaluation reads the methodology stamped on the plan — Student t or z for
 * classical bounds, gross or net MUS limits — never the firm's current settings.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { call } from "./support/call";
import { makeEngagement, makeFirm, makeUser } from "./support/factory";
import {
  drawSample,
  getEvaluation,
  listSampleItems,
  loadCanonicalPopulation,
  planSample,
  saveResult,
} from "./support/samples";
import * as methodology from "@/app/api/firm/methodology/route";
import { DEFAULT_METHODOLOGY } from "@/lib/validation/methodology";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let admin: number, staff: number, senior: number, engagement: number, populationId: number;

beforeAll(async () => {
  const firm = await makeFirm();
  admin = await makeUser(firm, "staff", { admin: true });
  [staff, senior] = await Promise.all([makeUser(firm, "staff"), makeUser(firm, "senior")]);
  const manager = await makeUser(firm, "manager");
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
    [staff, "staff"],
  ]);
  populationId = (await loadCanonicalPopulation(senior, engagement)).populationId;
});

afterAll(async () => {
  await getDb().destroy();
});

async function recordAll(id: number, audited: Record<string, string>) {
  for (const it of await listSampleItems(staff, engagement, id)) {
    expect(
      (
        await saveResult(staff, engagement, id, it.id, {
          version: it.version,
          status: "done",
          auditedValue: audited[it.itemRef] ?? it.bookValue,
        })
      ).status,
    ).toBe(200);
  }
}

describe("evaluation under the stamped methodology", () => {
  it("uses Student t (n − 1 df) and net MUS limits when the firm chose them at planning, and keeps them after the firm changes back", async () => {
    expect(
      (
        await call(methodology.PUT, "PUT", {
          as: admin,
          body: { ...DEFAULT_METHODOLOGY, classicalDistribution: "t", musLimits: "net" },
        })
      ).status,
    ).toBe(200);
    const classical = (
      await planSample(senior, engagement, {
        populationId,
        direction: "both",
        params: { method: "random", estimator: "mean-per-unit", tolerableMisstatement: "30000" },
      })
    ).json.sample.id as number;
    const mus = (
      await planSample(senior, engagement, {
        populationId,
        direction: "both",
        params: { method: "mus", tolerableMisstatement: "15000", factorMode: "table" },
      })
    ).json.sample.id as number;
    await drawSample(senior, engagement, classical, 5489);
    await drawSample(senior, engagement, mus, 1206281);
    await recordAll(classical, { INV004: "3425.75" });
    await recordAll(mus, { INV011: "3690.00", INV018: "2887.50" });
    // The firm switches back: the samples keep what their plans were stamped with.
    expect((await call(methodology.PUT, "PUT", { as: admin, body: DEFAULT_METHODOLOGY })).status).toBe(200);

    const c = await getEvaluation(staff, engagement, classical);
    const n = c.progress.total;
    expect(c.block.decision.distribution).toBe("t");
    expect(c.block.decision.degreesOfFreedom).toBe(n - 1);
    // Below 30 items the normal approximation is weak (common practice), said on the evaluation.
    expect(n).toBeLessThan(30);
    expect(c.warnings.join(" ")).toMatch(new RegExp(`Only ${n} items in the sample: below 30`));
    expect(c.block.decision.rule).toMatch(/Student/);

    const m = await getEvaluation(staff, engagement, mus);
    expect(m.block.limits).toBe("net");
    expect(m.block.compared).toEqual({
      overstatement: m.block.netUpperLimits.overstatement,
      understatement: m.block.netUpperLimits.understatement,
    });
    expect(m.block.statement).toMatch(/net upper limits/);
  });

  it("refuses a monetary-unit plan below 63 % confidence, naming the field and saying why", async () => {
    const r = await planSample(senior, engagement, {
      populationId,
      params: { method: "mus", tolerableMisstatement: "15000", confidence: 0.6 },
    });
    expect(r.status).toBe(400);
    expect(JSON.stringify(r.json.error.fields)).toMatch(/confidence/);
    expect(JSON.stringify(r.json.error)).toMatch(/RF\(0\) drops under 1/);
  });
});
