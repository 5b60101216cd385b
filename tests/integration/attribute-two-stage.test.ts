/**
 * Issue 13 §4: no unplanned extension of a fixed attribute sample; planned two-stage plans instead,
 * with stage 2 drawn by continuing the same random ranking (so the recipe re-performs both stages).
 */
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import stdlibBinomialCdf from "@stdlib/stats-base-dists-binomial-cdf";
import stdlibHypergeometricCdf from "@stdlib/stats-base-dists-hypergeometric-cdf";
import { getDb } from "@/db/knex";
import { call } from "./support/call";
import { makeEngagement, makeFirm, makeUser } from "./support/factory";
import { uploadAndLoad } from "./support/populations";
import { drawSample, getEvaluation, listSampleItems, planSample, saveResult } from "./support/samples";
import * as extend from "@/app/api/engagements/[engagementId]/samples/[sampleId]/extend/route";
import * as reperform from "@/app/api/engagements/[engagementId]/samples/[sampleId]/reperform/route";
import * as reconcile from "@/app/api/engagements/[engagementId]/populations/[populationId]/reconciliation/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let staff: number, senior: number, engagement: number, populationId: number;

/** 400 invented control executions (common practice: a population of transactions for a test of controls). */
const CSV =
  "id,amount\n" +
  Array.from(
    { length: 400 },
    (_, i) => `TX${String(i + 1).padStart(4, "0")},${(100 + ((i * 37) % 900)).toFixed(2)}`,
  ).join("\n") +
  "\n";

beforeAll(async () => {
  const firm = await makeFirm();
  [staff, senior] = await Promise.all([makeUser(firm, "staff"), makeUser(firm, "senior")]);
  const manager = await makeUser(firm, "manager");
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
    [staff, "staff"],
  ]);
  const { loaded } = await uploadAndLoad(senior, engagement, "controls.csv", CSV, {
    itemRefColumn: "id",
    bookValueColumn: "amount",
  });
  populationId = loaded!.last.populationId as number;
  await call(reconcile.POST, "POST", {
    as: senior,
    params: { engagementId: String(engagement), populationId: String(populationId) },
    body: { controlTotal: loaded!.last.total, controlCount: loaded!.last.rowCount },
  });
});

afterAll(async () => {
  await getDb().destroy();
});

async function record(
  sampleId: number,
  deviating: (index: number) => boolean,
  only?: (it: { status: string }) => boolean,
) {
  const items = await listSampleItems(staff, engagement, sampleId);
  let k = 0;
  for (const it of items) {
    if (only && !only(it)) continue;
    const deviation = deviating(k++);
    expect(
      (
        await saveResult(staff, engagement, sampleId, it.id, {
          version: it.version,
          status: "done",
          deviation,
          deviationNature: deviation ? "Approval missing" : null,
        })
      ).status,
    ).toBe(200);
  }
}

describe("attribute extension", () => {
  it("refuses to extend a fixed attribute sample once results exist, naming why (409)", async () => {
    const r = await planSample(senior, engagement, {
      populationId,
      direction: "both",
      params: { method: "attribute", tolerableRate: 0.05, expectedRate: 0, confidence: 0.95 },
    });
    const id = r.json.sample.id as number;
    await drawSample(senior, engagement, id, 77);
    await record(id, (k) => k === 3);
    const ext = await call(extend.POST, "POST", {
      as: senior,
      params: { engagementId: String(engagement), sampleId: String(id) },
      body: { additional: 34, reason: "One deviation found" },
    });
    expect(ext.status).toBe(409);
    expect(ext.json.error.message).toMatch(/unplanned sequential sampling.*about 7\.5%/);
    // N 400 is under the firm's default hypergeometric threshold (5,000): M = ⌈0.05 × 400⌉ = 20, and the smallest n with
    // HypergeometricCDF(0; 400, 20, n) ≤ 0.05 is 55 (@stdlib hypergeometric-cdf: n 54 → 0.0509, n 55 → 0.0480), not the binomial 59.
    expect(stdlibHypergeometricCdf(0, 400, 20, 54)).toBeGreaterThan(0.05);
    expect(stdlibHypergeometricCdf(0, 400, 20, 55)).toBeLessThanOrEqual(0.05);
    expect(r.json.sample.plan).toMatchObject({ model: "hypergeometric", computedSize: 55 });
    expect(await listSampleItems(staff, engagement, id)).toHaveLength(55);
  });

  it("plans two stages, continues the same ranking for stage 2 after exactly one deviation, and re-performs both", async () => {
    const r = await planSample(senior, engagement, {
      populationId,
      direction: "both",
      params: {
        method: "attribute",
        attributePlan: "two-stage",
        tolerableRate: 0.05,
        expectedRate: 0.01,
        confidence: 0.95,
      },
    });
    expect(r.status).toBe(201);
    const plan = r.json.sample.plan;
    // scipy.stats.binom (issue 13 rule): n₁ 65, n₂ 42, risk 0.04979236455930694, expected size 79.349.
    expect(plan.twoStage).toMatchObject({ firstStageSize: 65, secondStageSize: 42 });
    const f0 = stdlibBinomialCdf(0, 65, 0.05);
    expect(plan.twoStage.riskOfOverreliance).toBeCloseTo(f0 + (stdlibBinomialCdf(1, 65, 0.05) - f0) * 0.95 ** 42, 10);
    const id = r.json.sample.id as number;
    const params = { engagementId: String(engagement), sampleId: String(id) };
    await drawSample(senior, engagement, id, 78);
    const early = await call(extend.POST, "POST", { as: senior, params, body: { additional: 42, reason: "Stage 2" } });
    expect(early.status).toBe(409);
    await record(id, (k) => k === 10);
    let ev = await getEvaluation(staff, engagement, id);
    expect(ev.block.twoStage).toMatchObject({ stage: 1, decision: "continue", firstStageDeviations: 1 });
    expect(ev.computed.status).toBe("provisional");
    expect(
      (await call(extend.POST, "POST", { as: senior, params, body: { additional: 10, reason: "Stage 2" } })).status,
    ).toBe(409);
    const ext = await call(extend.POST, "POST", {
      as: senior,
      params,
      body: { additional: 42, reason: "Stage 2 of the plan" },
    });
    expect(ext.status).toBe(200);
    expect(await listSampleItems(staff, engagement, id)).toHaveLength(107);
    await record(
      id,
      () => false,
      (it) => it.status === "not-started",
    );
    ev = await getEvaluation(staff, engagement, id);
    expect(ev.block.twoStage).toMatchObject({ stage: 2, decision: "accept", secondStageDeviations: 0 });
    expect(ev.computed.status).toBe("supported");
    expect((await call(reperform.POST, "POST", { as: staff, params })).json.reperform.matches).toBe(true);
  });
});
