import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import gammaQuantile from "@stdlib/stats-base-dists-gamma-quantile";
import normalQuantile from "@stdlib/stats-base-dists-normal-quantile";
import { getDb } from "@/db/knex";
import { call } from "./support/call";
import { makeEngagement, makeFirm, makeUser } from "./support/factory";
import {
  CANONICAL_CSV,
  drawSample,
  listSampleItems,
  loadCanonicalPopulation,
  planSample,
  saveResult,
} from "./support/samples";
import * as methodology from "@/app/api/firm/methodology/route";
import * as preview from "@/app/api/engagements/[engagementId]/samples/plan-preview/route";
import { DEFAULT_METHODOLOGY, type MethodologySettings } from "@/lib/validation/methodology";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let admin: number, senior: number, staff: number, engagement: number, populationId: number;
const BV = 37959.96; // the canonical population's positive items (zero and negative excluded from the MUS frame)
const book = CANONICAL_CSV.trim()
  .split("\n")
  .slice(1)
  .map((l) => Number(l.split(",")[1]));
const N = book.length;

beforeAll(async () => {
  const firm = await makeFirm();
  admin = await makeUser(firm, "staff", { admin: true });
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

const setMethodology = async (settings: Partial<MethodologySettings>) =>
  expect(
    (await call(methodology.PUT, "PUT", { as: admin, body: { ...DEFAULT_METHODOLOGY, ...settings } })).status,
  ).toBe(200);
const previewPlan = (params: Record<string, unknown>) =>
  call(preview.POST, "POST", {
    as: staff,
    params: { engagementId: String(engagement) },
    body: { populationId, params: { confidence: 0.95, ...params } },
  });
const sd = (v: number[]) => {
  const m = v.reduce((a, b) => a + b, 0) / v.length;
  return Math.sqrt(v.reduce((a, b) => a + (b - m) ** 2, 0) / (v.length - 1));
};

describe("monetary-unit sizes follow the firm's methodology", () => {
  it("sizes with the confidence factor by default: n = ⌈R·BV/TM⌉, R the gamma root, and says so", async () => {
    const r = await planSample(senior, engagement, {
      populationId,
      params: { method: "mus", confidence: 0.95, tolerableMisstatement: "15000", expectedMisstatement: "3000" },
    });
    expect(r.status).toBe(201);
    const plan = r.json.sample.plan;
    // scipy 1.17.1 brentq root of R = gamma.ppf(0.95, 1 + 0.2R) = 4.620162; ⌈4.620162 × 37,959.96 / 15,000⌉ = ⌈11.69⌉ = 12.
    expect(plan).toMatchObject({ sizeMethod: "confidence-factor", factorMode: "exact", computedSize: 12 });
    expect(plan.inputs.R).toBeCloseTo(4.620162, 6);
    expect(Math.abs(gammaQuantile(0.95, 1 + plan.inputs.R * 0.2, 1) - plan.inputs.R)).toBeLessThan(1e-5); // @stdlib check of the root
    expect(plan.formula).toMatch(/confidence factor/);
    expect(r.json.sample.methodologyVersion).toBe(0);
  });

  it("refuses EM ≥ TM with a 400 naming expectedMisstatement", async () => {
    const r = await previewPlan({ method: "mus", tolerableMisstatement: "15000", expectedMisstatement: "15000" });
    expect(r.status).toBe(400);
    expect(r.json.error.fields).toHaveProperty(["params.expectedMisstatement"]);
  });

  it("uses the older expansion-factor method and table factors when the firm's methodology says so, and stamps them", async () => {
    await setMethodology({ musSizeMethod: "expansion-factor", factorMode: "table" });
    const r = await planSample(senior, engagement, {
      populationId,
      params: {
        method: "mus",
        confidence: 0.95,
        tolerableMisstatement: "15000",
        expectedMisstatement: "5000",
        factorMode: "exact",
      },
    });
    expect(r.status).toBe(201);
    const { plan, params, methodology: stamped } = r.json.sample;
    // AICPA Guide (older presentation): ⌈37,959.96 × 3.00 / (15,000 − 5,000 × 1.6)⌉ = ⌈16.27⌉ = 17 (RF 3.00 in table mode, EF 1.6 from memory).
    expect(plan).toMatchObject({
      sizeMethod: "expansion-factor",
      factorMode: "table",
      computedSize: Math.ceil((BV * 3) / (15000 - 8000)),
    });
    expect(plan.inputs).toMatchObject({ RF: 3, EF: 1.6 });
    expect(plan.notes.join(" ")).toMatch(/older presentation/);
    expect(params).not.toHaveProperty("factorMode"); // no per-plan choice: the stamped mode governs R and the evaluation factors
    expect(stamped).toMatchObject({ musSizeMethod: "expansion-factor", factorMode: "table" });
    await setMethodology({});
  });
});

describe("attribute plans: hypergeometric below the firm's threshold, and by control frequency", () => {
  it("uses the binomial Table A-1 size when the firm's threshold is below the population", async () => {
    await setMethodology({ hypergeometricBelow: 10 });
    const r = await previewPlan({ method: "attribute", tolerableRate: 0.2, expectedRate: 0 });
    // AICPA Audit Guide Table A-1 (5% risk): TDR 20%, EDR 0 → 14 (from memory; = ⌈ln 0.05 / ln 0.8⌉ = ⌈13.43⌉).
    expect(r.json.plan).toMatchObject({ model: "binomial", computedSize: 14 });
    await setMethodology({});
  });

  it("sizes a manual control from the firm's frequency table and prints the row used", async () => {
    const r = await previewPlan({
      method: "attribute",
      attributeMode: "control-frequency",
      controlFrequency: "weekly",
    });
    expect(r.status).toBe(200);
    // Shipped default (common practice, from memory): weekly → 5.
    expect(r.json.plan).toMatchObject({
      computedSize: 5,
      controlFrequencyRow: { frequency: "weekly", minimumSampleSize: 5 },
    });
    expect(r.json.plan.notes[0]).toMatch(/Row used: Weekly → 5 items/);
  });

  it("refuses a frequency plan with no frequency, naming the field", async () => {
    const r = await previewPlan({ method: "attribute", attributeMode: "control-frequency" });
    expect(r.status).toBe(400);
    expect(r.json.error.fields).toHaveProperty(["params.controlFrequency"]);
  });
});

describe("planning spread per estimator", () => {
  it("warns that a difference plan without a basis is the mean-per-unit size", async () => {
    const r = await previewPlan({ method: "random", estimator: "difference", tolerableMisstatement: "30000" });
    expect(r.status).toBe(200);
    expect(r.json.plan.spread).toMatchObject({ basis: "book-values" });
    expect(r.json.plan.warnings.join(" ")).toMatch(/the size is the mean-per-unit size/);
  });

  it("refuses an entered figure without a reason, naming spreadReason", async () => {
    const r = await previewPlan({
      method: "random",
      estimator: "difference",
      tolerableMisstatement: "30000",
      spreadBasis: "entered",
      expectedStdDev: "150",
    });
    expect(r.status).toBe(400);
    expect(r.json.error.fields).toHaveProperty(["params.spreadReason"]);
  });

  it("sizes with an entered figure and prints it with its reason", async () => {
    const r = await previewPlan({
      method: "random",
      estimator: "ratio",
      tolerableMisstatement: "3000",
      spreadBasis: "entered",
      expectedStdDev: "150",
      spreadReason: "Prior-year residuals",
    });
    const za = normalQuantile(0.95, 0, 1),
      zb = normalQuantile(0.95, 0, 1);
    const n1 = ((N * za * 150) / ((3000 * za) / (za + zb))) ** 2; // AICPA classical variables with S = 150
    expect(r.json.plan.computedSize).toBe(Math.min(N, Math.ceil(n1 / (1 + n1 / N) - 1e-9)));
    expect(r.json.plan.inputs["spread basis"]).toMatch(/S = 150.00, entered by the planner: Prior-year residuals/);
  });

  it("takes s_d from an earlier sample's results of the same engagement", async () => {
    const planned = await planSample(senior, engagement, {
      populationId,
      params: { method: "random", estimator: "mean-per-unit", tolerableMisstatement: "30000", confidence: 0.95 },
    });
    const priorId = planned.json.sample.id as number;
    expect((await drawSample(senior, engagement, priorId, 5489)).status).toBe(201);
    const differences: number[] = [];
    for (const [k, it] of (await listSampleItems(staff, engagement, priorId)).entries()) {
      const audited = Number(it.bookValue) - (k % 2 === 0 ? 25 : 0); // invented results: every other item overstated by 25
      differences.push(audited - Number(it.bookValue));
      expect(
        (
          await saveResult(staff, engagement, priorId, it.id, {
            version: it.version,
            status: "done",
            auditedValue: audited.toFixed(2),
          })
        ).status,
      ).toBe(200);
    }
    const r = await previewPlan({
      method: "random",
      estimator: "difference",
      tolerableMisstatement: "300",
      spreadBasis: "prior-sample",
      spreadSampleId: priorId,
    });
    expect(r.status).toBe(200);
    // s_d by hand: sample standard deviation (n − 1) of the recorded differences (Cochran 1977 §7.2, b = 1).
    expect(r.json.plan.spread.symbol).toBe("s_d");
    expect(r.json.plan.spread.value).toBeCloseTo(sd(differences), 9);
    expect(r.json.plan.inputs.s_d).toBeCloseTo(sd(differences), 2);
    expect(r.json.plan.warnings.join(" ")).not.toMatch(/mean-per-unit size/);
  });

  it("refuses an earlier sample that has no results, naming spreadSampleId", async () => {
    const planned = await planSample(senior, engagement, {
      populationId,
      params: { method: "random", estimator: "mean-per-unit", tolerableMisstatement: "30000" },
    });
    const r = await previewPlan({
      method: "random",
      estimator: "difference",
      tolerableMisstatement: "300",
      spreadBasis: "prior-sample",
      spreadSampleId: planned.json.sample.id,
    });
    expect(r.status).toBe(400);
    expect(r.json.error.fields).toHaveProperty("spreadSampleId");
  });
});

describe("zero and negative book values at planning", () => {
  it("warns before anything is drawn when they are a material share of a ratio plan's frame", async () => {
    // 2 of 20 items (INV003 at zero, INV008 at −420) = 10 % ≥ 5 % (common practice threshold).
    const r = await previewPlan({ method: "random", estimator: "ratio", tolerableMisstatement: "30000" });
    expect(r.status).toBe(200);
    expect(r.json.plan.warnings.join(" ")).toMatch(
      /2 of 20 items are zero or negative .* test(ing)? credit balances as their own population/,
    );
    expect(book.filter((v) => v <= 0)).toHaveLength(2);
  });
});
