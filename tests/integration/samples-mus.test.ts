import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import gammaQuantile from "@stdlib/stats-base-dists-gamma-quantile";
import { getDb } from "@/db/knex";
import { call, callRaw } from "./support/call";
import { makeEngagement, makeFirm, makeUser } from "./support/factory";
import {
  CANONICAL_CSV,
  CANONICAL_SHA256,
  drawSample,
  getEvaluation,
  listSampleItems,
  loadCanonicalPopulation,
  planSample,
  saveResult,
} from "./support/samples";
import * as reperform from "@/app/api/engagements/[engagementId]/samples/[sampleId]/reperform/route";
import * as recipe from "@/app/api/engagements/[engagementId]/samples/[sampleId]/recipe/route";
import * as one from "@/app/api/engagements/[engagementId]/samples/[sampleId]/route";
import * as methodology from "@/app/api/firm/methodology/route";
import { DEFAULT_METHODOLOGY } from "@/lib/validation/methodology";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let senior: number,
  staff: number,
  outsider: number,
  engagement: number,
  populationId: number,
  sampleId: number,
  admin: number;
// The factor mode is the firm's methodology setting (stamped on each plan), not a per-plan choice.
const useFactorMode = async (factorMode: "exact" | "table") =>
  expect((await call(methodology.PUT, "PUT", { as: admin, body: { ...DEFAULT_METHODOLOGY, factorMode } })).status).toBe(
    200,
  );

// The canonical population's positive book values in cents, in file order (zero and negative excluded from PPS).
const rows = CANONICAL_CSV.trim()
  .split("\n")
  .slice(1)
  .map((l, i) => ({ ref: l.split(",")[0], row: i + 2, cents: BigInt(l.split(",")[1].replace(".", "")) }));
const positives = rows.filter((r) => r.cents > 0n);
const BV_CENTS = positives.reduce((a, r) => a + r.cents, 0n); // 3,795,996 cents

beforeAll(async () => {
  const firm = await makeFirm();
  [senior, staff, outsider] = await Promise.all([
    makeUser(firm, "senior"),
    makeUser(firm, "staff"),
    makeUser(firm, "senior"),
  ]);
  const manager = await makeUser(firm, "manager");
  admin = await makeUser(firm, "staff", { admin: true });
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
    [staff, "staff"],
  ]);
  await makeEngagement(firm, manager, [
    [manager, "manager"],
    [outsider, "senior"],
  ]);
  await useFactorMode("table");
  const loaded = await loadCanonicalPopulation(senior, engagement);
  populationId = loaded.populationId;
  expect(loaded.sha256).toBe(CANONICAL_SHA256);
});

afterAll(async () => {
  await getDb().destroy();
});

const params = () => ({ engagementId: String(engagement), sampleId: String(sampleId) });

describe("monetary-unit sample: plan", () => {
  it("computes n = ⌈BV·RF/(TM − EM·EF)⌉ and J = ⌊BV/n⌋, excluding zero and negative items", async () => {
    const r = await planSample(senior, engagement, {
      populationId,
      params: {
        method: "mus",
        confidence: 0.95,
        tolerableMisstatement: "15000",
        expectedMisstatement: "0",
        factorMode: "table",
      },
    });
    expect(r.status).toBe(201);
    sampleId = r.json.sample.id;
    const plan = r.json.sample.plan;
    // AICPA Audit Guide "Audit Sampling", MUS sample size: RF for 0 misstatements at 95% = −ln(0.05) = 2.995732 (Poisson).
    const rf = -Math.log(0.05);
    const bv = Number(BV_CENTS) / 100;
    expect(plan.inputs.BV).toBe("37959.96");
    expect(plan.computedSize).toBe(Math.ceil((bv * rf) / 15000));
    expect(plan.computedSize).toBe(8);
    expect(plan.interval).toBe(Math.floor(bv / 8)); // 4744
    expect(plan.excluded).toEqual({ zeroCount: 1, negativeCount: 1, negativeTotal: "-420.00" });
    expect(plan.topStratum).toEqual({ count: 1, total: "12500.00" }); // INV006 ≥ J
  });

  it("refuses staff (403) and another engagement's user (404)", async () => {
    expect((await planSample(staff, engagement, { populationId, params: { method: "mus" } })).status).toBe(403);
    expect((await planSample(outsider, engagement, { populationId, params: { method: "mus" } })).status).toBe(404);
  });

  it("will not lower the size below the computed one without a reason", async () => {
    const r = await planSample(senior, engagement, {
      populationId,
      params: { method: "mus", tolerableMisstatement: "15000", sampleSize: 5 },
    });
    expect(r.status).toBe(400);
    expect(r.json.error.fields).toHaveProperty("sampleSize");
  });
});

describe("monetary-unit sample: draw, re-perform, recipe", () => {
  it("selects the hits the published rule gives for the stored seed", async () => {
    expect((await drawSample(staff, engagement, sampleId, 1206281)).status).toBe(403); // staff cannot draw
    const r = await drawSample(senior, engagement, sampleId, 1206281);
    expect(r.status).toBe(201);
    expect(r.json.currentDraw).toMatchObject({
      version: 1,
      seed: 1206281,
      seedSource: "entered",
      populationSha256: CANONICAL_SHA256,
    });
    // numpy 1.24 RandomState(1206281).random_sample() = 0.6547467429185535 (MT19937 init_genrand + genrand_res53);
    // selection rule: r = 1 + ⌊u·J⌋ cents, points r + jJ, item i hit when c(i−1) < p ≤ c(i) (lib/sampling/README.md §2).
    const J = 474400n;
    const start = 1n + BigInt(Math.floor(0.6547467429185535 * 474400));
    const expected = new Map<string, number>();
    let cum = 0n;
    let p = start;
    for (const item of positives) {
      cum += item.cents;
      while (p <= cum) {
        expected.set(item.ref, (expected.get(item.ref) ?? 0) + 1);
        p += J;
      }
    }
    const items = await listSampleItems(staff, engagement, sampleId);
    expect(new Map(items.map((i) => [i.itemRef, i.hitPoints?.length ?? 0]))).toEqual(expected);
    expect(items.find((i) => i.itemRef === "INV006")?.topStratum).toBe(true);
    expect(items.filter((i) => i.topStratum).map((i) => i.itemRef)).toEqual(["INV006"]);
  });

  it("re-performs item for item", async () => {
    const r = await call(reperform.POST, "POST", { as: staff, params: params() });
    expect(r.json.reperform).toMatchObject({ matches: true, differences: [] });
  });

  it("gives a recipe with the seed, the file hash and the numpy steps", async () => {
    const res = await callRaw(recipe.GET, "GET", { as: staff, params: params() });
    const text = await res.text();
    expect(text).toContain("np.random.RandomState(1206281)");
    expect(text).toContain(CANONICAL_SHA256);
    expect(text).toContain("J = 474400");
  });

  it("drawing again creates version 2 with a different selection for a different seed, keeping version 1", async () => {
    const before = (await listSampleItems(staff, engagement, sampleId)).map((i) => i.itemRef).join();
    const second = await drawSample(senior, engagement, sampleId, 121285);
    expect(second.json.draws.map((d: { version: number; current: boolean }) => [d.version, d.current])).toEqual([
      [2, true],
      [1, false],
    ]);
    const after = await listSampleItems(staff, engagement, sampleId);
    // numpy RandomState(121285).random_sample() = 3.999558920275703e-06 → r = 2 cents: 9 points, not 8.
    expect(after.reduce((n, i) => n + (i.hitPoints?.length ?? 0), 0)).toBe(9);
    expect(after.map((i) => i.itemRef).join()).not.toBe(before);
    const old = await getDb()("sample_items")
      .where("sample_items.sample_id", sampleId)
      .join("sample_draws as d", "d.id", "sample_items.draw_id")
      .where("d.version", 1)
      .count({ n: "*" })
      .first();
    expect(Number(old?.n)).toBeGreaterThan(0);
    // The same seed again gives the same selection as version 1.
    await drawSample(senior, engagement, sampleId, 1206281);
    expect((await listSampleItems(staff, engagement, sampleId)).map((i) => i.itemRef).join()).toBe(before);
  });

  it("refuses to change the plan once drawn", async () => {
    const r = await call(one.PATCH, "PATCH", {
      as: senior,
      params: params(),
      body: {
        populationId,
        name: "Changed",
        objective: "Test existence",
        assertion: "Existence",
        direction: "overstatement",
        params: { method: "mus" },
      },
    });
    expect(r.status).toBe(409);
  });
});

describe("monetary-unit sample: fieldwork and the Stringer bound", () => {
  it("records results with optimistic concurrency and evaluates to the published Stringer arithmetic", async () => {
    const items = await listSampleItems(staff, engagement, sampleId);
    const byRef = new Map(items.map((i) => [i.itemRef, i]));
    const results: Record<string, Record<string, unknown>> = {};
    for (const i of items) results[i.itemRef] = { status: "done", auditedValue: i.bookValue };
    // Invented fieldwork outcomes chosen for exact taintings; expected values follow the Stringer formula below.
    const audited: Record<string, Record<string, unknown>> = {
      INV006: { status: "done", auditedValue: "12000.00", cause: "pricing" }, // top stratum: 500.00 at actual
      INV011: { status: "done", auditedValue: "3690.00", cause: "cut-off" }, // tainting 0.10
      INV018: { status: "done", auditedValue: "2887.50", cause: "classification" }, // understatement, tainting 0.05
    };
    const notAuditable = [...byRef.keys()].find((ref) => !(ref in audited) && !byRef.get(ref)!.topStratum)!;
    audited[notAuditable] = {
      status: "not-auditable",
      comment: "Customer confirmation not returned; no alternative evidence",
    }; // tainting 1
    for (const [ref, patch] of Object.entries({ ...results, ...audited })) {
      const it = byRef.get(ref);
      if (!it) continue;
      const r = await saveResult(staff, engagement, sampleId, it.id, { version: it.version, ...patch });
      expect(r.status).toBe(200);
    }
    const ev = await getEvaluation(staff, engagement, sampleId);
    const J = 4744;
    // AICPA Audit Guide "Audit Sampling", MUS evaluation table, 95% confidence: 3.00, 4.75, 6.30 for 0, 1, 2 misstatements (published, rounded up).
    const RF = [3.0, 4.75, 6.3];
    expect([...byRef.keys()]).toEqual(expect.arrayContaining(["INV006", "INV011", "INV018"]));
    const over = [1.0, 0.1];
    const basic = RF[0] * J;
    const projectedOver = over.reduce((s, t) => s + t * J, 0) + 500;
    const allowanceOver = over.reduce((s, t, k) => s + (RF[k + 1] - RF[k] - 1) * t * J, 0);
    const b = ev.block;
    expect(b.method).toBe("mus");
    expect(b.factorMode).toBe("table");
    expect(Number(b.overstatement.basicPrecision)).toBeCloseTo(basic, 2);
    expect(Number(b.overstatement.projected)).toBeCloseTo(projectedOver, 2);
    expect(Number(b.overstatement.incrementalAllowance)).toBeCloseTo(allowanceOver, 2);
    expect(Number(b.overstatement.upperLimit)).toBeCloseTo(basic + projectedOver + allowanceOver, 2);
    expect(Number(b.understatement.upperLimit)).toBeCloseTo(RF[0] * J + 0.05 * J + (RF[1] - RF[0] - 1) * 0.05 * J, 2);
    // Net limits subtract the opposite direction's projection (lib/sampling/README.md §4).
    expect(Number(b.netUpperLimits.overstatement)).toBeCloseTo(basic + projectedOver + allowanceOver - 0.05 * J, 2);
    expect(b.overstatement.rows.map((r: { factor: number }) => r.factor)).toEqual(RF.slice(1, over.length + 1));
    // One meaning of the increment everywhere: RF(k) − RF(k−1).
    expect(b.overstatement.rows.map((r: { factorIncrement: number }) => r.factorIncrement)).toEqual(
      [RF[1] - RF[0], RF[2] - RF[1]].map((x) => expect.closeTo(x, 9)),
    );
    expect(ev.complete).toBe(true);
    // Gross by default (issue 13 §3): the overstatement test compares the gross upper limit with TM.
    expect(b.limits).toBe("gross");
    expect(b.compared).toEqual({ overstatement: b.overstatement.upperLimit, understatement: null });
    expect(ev.computed.supported).toBe(Number(b.overstatement.upperLimit) <= 15000);
    expect(b.statement).toMatch(/gross upper limits/);
    expect(ev.notes.join(" ")).toMatch(/could not be audited counts as fully misstated/);
    expect(ev.caution).toMatch(/AU-C 530, ISA 530, AS 2315/);
    expect(ev.progress).toMatchObject({ notAuditable: 1, notStarted: 0 });
  });

  it("answers a stale save with 409 naming who changed the item, and keeps their value", async () => {
    const [first] = await listSampleItems(staff, engagement, sampleId);
    const staleVersion = first.version - 1;
    const r = await saveResult(senior, engagement, sampleId, first.id, {
      version: staleVersion,
      status: "done",
      auditedValue: "1.00",
    });
    expect(r.status).toBe(409);
    expect(r.json.error.message).toMatch(
      /Person \d+ \(staff\) changed this item on \d{1,2} [A-Z][a-z]{2} \d{4}, \d{2}:\d{2} UTC, after you opened it/,
    );
    const [again] = await listSampleItems(staff, engagement, sampleId);
    expect(again.version).toBe(first.version);
  });

  it("computes exact factors from the gamma quantile when the firm's methodology asks for them", async () => {
    await useFactorMode("exact");
    const r = await planSample(senior, engagement, {
      populationId,
      params: { method: "mus", tolerableMisstatement: "15000", factorMode: "exact" },
    });
    const id = r.json.sample.id;
    await drawSample(senior, engagement, id, 1206281);
    const items = await listSampleItems(staff, engagement, id);
    for (const it of items)
      await saveResult(staff, engagement, id, it.id, {
        version: it.version,
        status: "done",
        auditedValue: it.itemRef === "INV011" ? "3690.00" : it.bookValue,
      });
    const ev = await getEvaluation(staff, engagement, id);
    // @stdlib gamma quantile (shape k+1, rate 1) as an independent implementation of the Poisson upper limit.
    const rf0 = gammaQuantile(0.95, 1, 1);
    const rf1 = gammaQuantile(0.95, 2, 1);
    expect(rf0).toBeCloseTo(2.995732, 6); // −ln(0.05)
    expect(Number(ev.block.overstatement.upperLimit)).toBeCloseTo(
      rf0 * 4744 + 0.1 * 4744 + (rf1 - rf0 - 1) * 0.1 * 4744,
      2,
    );
  });
});
