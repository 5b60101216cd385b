import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import normalQuantile from "@stdlib/stats-base-dists-normal-quantile";
import { getDb } from "@/db/knex";
import { createRng } from "@/lib/sampling";
import { call } from "./support/call";
import { makeEngagement, makeFirm, makeUser } from "./support/factory";
import {
  CANONICAL_CSV,
  drawSample,
  getEvaluation,
  listSampleItems,
  loadCanonicalPopulation,
  planSample,
  saveResult,
} from "./support/samples";
import * as extend from "@/app/api/engagements/[engagementId]/samples/[sampleId]/extend/route";
import * as replace from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/[itemId]/replace/route";
import * as reperform from "@/app/api/engagements/[engagementId]/samples/[sampleId]/reperform/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let senior: number, staff: number, engagement: number, populationId: number;
const book = CANONICAL_CSV.trim()
  .split("\n")
  .slice(1)
  .map((l) => ({ ref: l.split(",")[0], value: Number(l.split(",")[1]) }));
const N = book.length;
const X = 37539.96; // total book value of all 20 items, negatives and zeros included

beforeAll(async () => {
  const firm = await makeFirm();
  [senior, staff] = await Promise.all([makeUser(firm, "senior"), makeUser(firm, "staff")]);
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

// Invented audited values for the demo population: three overstatements, the rest as booked.
const AUDITED: Record<string, number> = { INV004: 3425.75, INV011: 3900.0, INV016: 1150.0, INV006: 12200.0 };
const auditedOf = (ref: string, value: number) => AUDITED[ref] ?? value;

async function drawnSampleWith(params: Record<string, unknown>, seed = 5489) {
  const r = await planSample(senior, engagement, {
    populationId,
    params: { tolerableMisstatement: "30000", confidence: 0.95, riskOfIncorrectRejection: 0.1, ...params },
  });
  expect(r.status).toBe(201);
  const id = r.json.sample.id as number;
  expect((await drawSample(senior, engagement, id, seed)).status).toBe(201);
  return { id, plan: r.json.sample.plan };
}

/** Records every item: audited amounts, or — for an attribute sample — deviation yes/no. */
async function recordAll(sampleId: number, deviationRefs?: string[]) {
  for (const it of await listSampleItems(staff, engagement, sampleId)) {
    const body = deviationRefs
      ? {
          status: "done",
          deviation: deviationRefs.includes(it.itemRef),
          deviationNature: deviationRefs.includes(it.itemRef) ? "Approval missing" : null,
        }
      : { status: "done", auditedValue: auditedOf(it.itemRef, Number(it.bookValue)).toFixed(2) };
    expect((await saveResult(staff, engagement, sampleId, it.id, { version: it.version, ...body })).status).toBe(200);
  }
}

const sampleSd = (v: number[]) => {
  const m = v.reduce((a, b) => a + b, 0) / v.length;
  return Math.sqrt(v.reduce((a, b) => a + (b - m) ** 2, 0) / (v.length - 1));
};

describe("classical variables", () => {
  it("sizes the sample with the AICPA classical-variables formula and selects the n smallest random numbers", async () => {
    const { id, plan } = await drawnSampleWith({ method: "random", estimator: "mean-per-unit" });
    // z_α two-sided for a 10% risk of incorrect rejection, z_β one-sided for 5% risk of incorrect acceptance (@stdlib normal quantile).
    // The test is for overstatement only, so z_α is one-sided too (issue 13: the plan stores the sides it used).
    const za = normalQuantile(0.9, 0, 1),
      zb = normalQuantile(0.95, 0, 1);
    expect(plan.sides).toBe("one");
    const A = (30000 * za) / (za + zb);
    const n1 = ((N * za * sampleSd(book.map((b) => b.value))) / A) ** 2;
    expect(plan.computedSize).toBe(Math.ceil(n1 / (1 + n1 / N)));
    // Random-number sort: item i gets the (i+1)-th genrand_res53 double; the n smallest, ascending (lib/sampling/README.md §2).
    const rng = createRng(5489);
    const u = book.map((b) => ({ ref: b.ref, u: rng.nextDouble() }));
    const expected = [...u]
      .sort((a, b) => a.u - b.u)
      .slice(0, plan.computedSize)
      .map((x) => x.ref);
    expect((await listSampleItems(staff, engagement, id)).map((i) => i.itemRef)).toEqual(expected);
  });

  for (const estimator of ["mean-per-unit", "difference", "ratio", "regression"] as const) {
    it(`evaluates the ${estimator} estimator to Cochran's formulas`, async () => {
      const { id } = await drawnSampleWith({ method: "random", estimator });
      await recordAll(id);
      const items = await listSampleItems(staff, engagement, id);
      const x = items.map((i) => Number(i.bookValue));
      const y = items.map((i) => auditedOf(i.itemRef, Number(i.bookValue)));
      const n = x.length,
        f = n / N;
      const mean = (v: number[]) => v.reduce((a, b) => a + b, 0) / v.length;
      let Y: number, v: number;
      // Cochran, Sampling Techniques (3rd ed., 1977): expansion (MPU), difference, ratio (eq. 6.9) and regression
      // estimators with the finite population correction (equation numbers other than 6.9 from memory).
      if (estimator === "mean-per-unit") {
        Y = N * mean(y);
        v = (N * N * (1 - f) * sampleSd(y) ** 2) / n;
      } else if (estimator === "difference") {
        const d = y.map((yi, i) => yi - x[i]);
        Y = X + N * mean(d);
        v = (N * N * (1 - f) * sampleSd(d) ** 2) / n;
      } else if (estimator === "ratio") {
        const R = y.reduce((a, b) => a + b, 0) / x.reduce((a, b) => a + b, 0);
        Y = R * X;
        v = (((N * N * (1 - f)) / n) * y.reduce((s, yi, i) => s + (yi - R * x[i]) ** 2, 0)) / (n - 1);
      } else {
        const xm = mean(x),
          ym = mean(y);
        const b = x.reduce((s, xi, i) => s + (xi - xm) * (y[i] - ym), 0) / x.reduce((s, xi) => s + (xi - xm) ** 2, 0);
        Y = N * (ym + b * (X / N - xm));
        v = (((N * N * (1 - f)) / n) * x.reduce((s, xi, i) => s + (y[i] - ym - b * (xi - xm)) ** 2, 0)) / (n - 2);
      }
      const ev = await getEvaluation(staff, engagement, id);
      const plan = (await getDb()("samples").where({ id }).first("plan_json"))!.plan_json;
      const A = Number((typeof plan === "string" ? JSON.parse(plan) : plan).inputs.A);
      // AICPA Audit Guide decision rule, overstatement only: A′ = z_α·SE with z_α one-sided at 1 − RIR (RIR 10%);
      // A″ = A′ + TM·(1 − A′/A) when A′ > A; supported when X ≤ Ŷ + allowance.
      const za = normalQuantile(0.9, 0, 1);
      const achieved = za * Math.sqrt(v);
      const allowance = achieved > A ? achieved + 30000 * (1 - achieved / A) : achieved;
      expect(ev.block.method).toBe("variables");
      expect(Number(ev.block.estimatedAuditedValue)).toBeCloseTo(Y, 2);
      expect(Number(ev.block.standardError)).toBeCloseTo(Math.sqrt(v), 2);
      expect(Number(ev.block.decision.achievedAllowance)).toBeCloseTo(achieved, 2);
      expect(Number(ev.block.decision.allowance)).toBeCloseTo(allowance, 2);
      expect(ev.block.decision.lowerLimit).toBeNull();
      expect(Number(ev.block.decision.upperLimit)).toBeCloseTo(Y + allowance, 2);
      expect(ev.block.decision.supported).toBe(X <= Y + allowance);
      expect(Number(ev.projectedMisstatement)).toBeCloseTo(X - Y, 2);
      expect(ev.computed.status).toBe(X <= Y + allowance ? "supported" : "not-supported");
      if (estimator !== "mean-per-unit") expect(ev.warnings.join(" ")).toMatch(/misstatement/i); // too few misstatements (common practice: about 20)
    });
  }

  it("extends and replaces by continuing the same random ranking, and still re-performs", async () => {
    const { id, plan } = await drawnSampleWith({ method: "random", estimator: "ratio" });
    const params = { engagementId: String(engagement), sampleId: String(id) };
    const before = (await listSampleItems(staff, engagement, id)).map((i) => i.itemRef);
    expect(
      (await call(extend.POST, "POST", { as: staff, params, body: { additional: 2, reason: "Misstatements found" } }))
        .status,
    ).toBe(403);
    const ext = await call(extend.POST, "POST", {
      as: senior,
      params,
      body: { additional: 2, reason: "More misstatements than expected" },
    });
    expect(ext.json.extension).toEqual({ added: 2, streamPosition: plan.computedSize });
    const rng = createRng(5489);
    const ranked = book
      .map((b) => ({ ref: b.ref, u: rng.nextDouble() }))
      .sort((a, b) => a.u - b.u)
      .map((x) => x.ref);
    const after = await listSampleItems(staff, engagement, id);
    expect(after.map((i) => i.itemRef)).toEqual(ranked.slice(0, plan.computedSize + 2));
    expect(after.slice(0, before.length).map((i) => i.itemRef)).toEqual(before);
    const rep = await call(replace.POST, "POST", {
      as: senior,
      params: { ...params, itemId: String(after[0].id) },
      body: { reason: "Invoice voided and reissued" },
    });
    expect(rep.json.replacement.replacementRow).toBe(
      book.findIndex((b) => b.ref === ranked[plan.computedSize + 2]) + 2,
    );
    expect((await call(reperform.POST, "POST", { as: staff, params })).json.reperform.matches).toBe(true);
  });

  it("evaluates a stratified mean-per-unit sample as the sum of the strata (Cochran 1977 ch. 5; equation number from memory)", async () => {
    const { id, plan } = await drawnSampleWith({
      method: "stratified",
      estimator: "mean-per-unit",
      strataBounds: ["1000", "3000"],
    });
    expect(plan.strata.map((s: { populationSize: number }) => s.populationSize)).toEqual([11, 5, 4]);
    await recordAll(id);
    const items = await listSampleItems(staff, engagement, id);
    const full = await getDb()("sample_items")
      .whereIn(
        "id",
        items.map((i) => i.id),
      )
      .select("item_ref", "stratum", "book_value");
    let Y = 0,
      v = 0;
    for (const s of plan.strata as { number: number; populationSize: number }[]) {
      const y = full.filter((r) => r.stratum === s.number).map((r) => auditedOf(r.item_ref, Number(r.book_value)));
      const nh = y.length,
        Nh = s.populationSize;
      Y += (Nh * y.reduce((a, b) => a + b, 0)) / nh;
      if (nh > 1) v += (Nh * Nh * (1 - nh / Nh) * sampleSd(y) ** 2) / nh;
    }
    const ev = await getEvaluation(staff, engagement, id);
    expect(Number(ev.block.estimatedAuditedValue)).toBeCloseTo(Y, 2);
    expect(Number(ev.block.standardError)).toBeCloseTo(Math.sqrt(v), 2);
  });
});

describe("attribute sampling", () => {
  it("sizes a 20-item population with the hypergeometric distribution (under the firm's 5,000) and evaluates its exact upper limit", async () => {
    const { id, plan } = await drawnSampleWith({ method: "attribute", tolerableRate: 0.2, expectedRate: 0 });
    // N 20 < 5,000 (firm default hypergeometricBelow): M = ⌈0.2 × 20⌉ = 4; scipy 1.17.1 hypergeom.cdf(0, 20, 4, 10) = 0.04334 ≤ 0.05,
    // hypergeom.cdf(0, 20, 4, 9) = 0.06811 → n 10 (the binomial Table A-1 size would be 14).
    expect(plan.computedSize).toBe(10);
    expect(plan.model).toBe("hypergeometric");
    expect(plan.inputs).toMatchObject({ N: 20, M: 4 });
    expect(plan.notes.join(" ")).toMatch(/under the firm's threshold of 5,000/);
    const items = await listSampleItems(staff, engagement, id);
    await recordAll(id, [items[3].itemRef]);
    const ev = await getEvaluation(staff, engagement, id);
    // scipy: hypergeom.cdf(1, 20, 6, 10) = 0.0704 > 0.05, hypergeom.cdf(1, 20, 7, 10) = 0.0286 → M_U 6, upper limit 6/20 = 30%.
    expect(ev.block).toMatchObject({
      method: "attributes",
      sampleSize: 10,
      deviations: 1,
      model: "hypergeometric",
      upperDeviations: 6,
    });
    expect(ev.block.upperDeviationLimit).toBeCloseTo(0.3, 12);
    expect(ev.computed.supported).toBe(false);
  });
});

describe("drawing needs a reconciled population", () => {
  it("answers 409 until the control total is recorded", async () => {
    const { uploadAndLoad } = await import("./support/populations");
    const { loaded } = await uploadAndLoad(senior, engagement, "unreconciled.csv", CANONICAL_CSV, {
      itemRefColumn: "id",
      bookValueColumn: "book_value",
    });
    const r = await planSample(senior, engagement, {
      populationId: loaded!.last.populationId,
      params: { method: "mus", tolerableMisstatement: "15000" },
    });
    const d = await drawSample(senior, engagement, r.json.sample.id);
    expect(d.status).toBe(409);
    expect(d.json.error.message).toMatch(/not reconciled/);
  });
});
