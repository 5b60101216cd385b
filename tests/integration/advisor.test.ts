import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { createRng } from "@/lib/sampling";
import { call, callEvents, callRaw } from "./support/call";
import { auditCount, makeEngagement, makeFirm, makeUser } from "./support/factory";
import { uploadAndLoad } from "./support/populations";
import { drawSample, listSampleItems, planSample, saveResult } from "./support/samples";
import * as reconcile from "@/app/api/engagements/[engagementId]/populations/[populationId]/reconciliation/route";
import * as advisor from "@/app/api/engagements/[engagementId]/samples/[sampleId]/advisor/route";
import * as advisorRun from "@/app/api/engagements/[engagementId]/samples/[sampleId]/advisor/[runId]/route";
import * as adopt from "@/app/api/engagements/[engagementId]/samples/[sampleId]/advisor/[runId]/adopt/route";
import { ADVISOR_HEARTBEAT_SECONDS, requestAdvisorCancel } from "@/lib/data/advisor-runs";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let senior: number,
  staff: number,
  outsider: number,
  engagement: number,
  populationId: number,
  ratioSample: number,
  musSample: number;
const N = 3000;

beforeAll(async () => {
  const firm = await makeFirm();
  [senior, staff, outsider] = await Promise.all([
    makeUser(firm, "senior"),
    makeUser(firm, "staff"),
    makeUser(firm, "senior"),
  ]);
  const manager = await makeUser(firm, "manager");
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
    [staff, "staff"],
  ]);
  await makeEngagement(firm, manager, [
    [manager, "manager"],
    [outsider, "senior"],
  ]);
  const rng = createRng(31);
  const lines = Array.from(
    { length: N },
    (_, i) => `L${String(i + 1).padStart(5, "0")},${(5 + 4000 * rng.nextDouble() ** 2).toFixed(2)}`,
  );
  const { loaded } = await uploadAndLoad(senior, engagement, "ledger.csv", `ref,amount\n${lines.join("\n")}\n`, {
    itemRefColumn: "ref",
    bookValueColumn: "amount",
  });
  populationId = loaded!.last.populationId;
  await call(reconcile.POST, "POST", {
    as: senior,
    params: { engagementId: String(engagement), populationId: String(populationId) },
    body: { controlTotal: loaded!.last.total, controlCount: loaded!.last.rowCount },
  });
  ratioSample = (
    await planSample(senior, engagement, {
      populationId,
      params: {
        method: "random",
        estimator: "ratio",
        confidence: 0.95,
        tolerableMisstatement: "200000",
        sampleSize: 60,
        sizeReason: "advisor test",
      },
    })
  ).json.sample.id;
  musSample = (
    await planSample(senior, engagement, {
      populationId,
      params: { method: "mus", confidence: 0.95, tolerableMisstatement: "200000" },
    })
  ).json.sample.id;
});

afterAll(async () => {
  await getDb().destroy();
});

const at = (sampleId: number, extra: Record<string, string> = {}) => ({
  engagementId: String(engagement),
  sampleId: String(sampleId),
  ...extra,
});
const scenario = { kind: "pattern", misstatedPercent: 10, tainting: "mostly-small", overstatementPercent: 90 };

describe("estimator advisor API", () => {
  it("starts a run, streams progress, and returns every estimator at every size with a recommendation", async () => {
    const r = await callEvents(advisor.POST, "POST", {
      as: senior,
      params: at(ratioSample),
      body: { scenario, sampleSizes: [30, 60], trials: 3000, seed: 7 },
    });
    expect(r.status).toBe(200);
    expect(r.events[0]).toMatchObject({ type: "started", total: 6000 });
    expect(r.events.some((e) => e.type === "progress")).toBe(true);
    expect(r.last).toMatchObject({ type: "result", cached: false });
    const run = r.last.run;
    expect(run.status).toBe("done");
    expect(run.request).toMatchObject({
      seed: 7,
      seedSource: "entered",
      sampleSizes: [30, 60],
      confidence: 0.95,
      sides: "lower",
      plannedSize: 60,
    });
    expect(
      run.result.cells.map((c: { estimator: string; sampleSize: number }) => `${c.estimator}@${c.sampleSize}`).sort(),
    ).toEqual([
      "beale-ratio@30",
      "beale-ratio@60",
      "difference@30",
      "difference@60",
      "hartley-ross@30",
      "hartley-ross@60",
      "jackknife-ratio@30",
      "jackknife-ratio@60",
      "mean-per-unit@30",
      "mean-per-unit@60",
      "ratio@30",
      "ratio@60",
      "regression@30",
      "regression@60",
      "tin-ratio@30",
      "tin-ratio@60",
    ]);
    for (const c of run.result.cells)
      expect(c.performance.histogram.reduce((s: number, b: { count: number }) => s + b.count, 0)).toBe(3000);
    expect(run.result.recommendation.sampleSize).toBe(60);
    expect(run.result.recommendation.verdicts).toHaveLength(8);
    // The bias-corrected ratio forms are comparison rows, never the recommendation.
    expect(
      run.result.recommendation.verdicts.filter((v: { verdict: string }) => v.verdict === "comparison"),
    ).toHaveLength(4);
    expect(["mean-per-unit", "difference", "ratio", "regression", null]).toContain(
      run.result.recommendation.recommended,
    );
    expect(run.result.truth.items).toBe(N);
    expect(await auditCount({ entity: "advisor_run", action: "done" })).toBeGreaterThanOrEqual(1);
  });

  it("answers the same population, scenario, sizes, trials and seed from the cache with the same figures", async () => {
    const body = { scenario, sampleSizes: [60, 30], trials: 3000, seed: 7 };
    const again = await callEvents(advisor.POST, "POST", { as: senior, params: at(ratioSample), body });
    expect(again.events).toHaveLength(1);
    expect(again.last).toMatchObject({ type: "result", cached: true });
    const fresh = await callEvents(advisor.POST, "POST", {
      as: senior,
      params: at(ratioSample),
      body: { ...body, trials: 3001 },
    });
    expect(fresh.last.cached).toBe(false);
    const a = again.last.run.result.cells.find(
      (c: { estimator: string; sampleSize: number }) => c.estimator === "ratio" && c.sampleSize === 30,
    );
    const b = fresh.last.run.result.cells.find(
      (c: { estimator: string; sampleSize: number }) => c.estimator === "ratio" && c.sampleSize === 30,
    );
    expect(b.performance.bias).not.toBe(a.performance.bias);
  });

  it("adds the Stringer bound for a monetary-unit plan", async () => {
    const r = await callEvents(advisor.POST, "POST", {
      as: senior,
      params: at(musSample),
      body: { scenario, sampleSizes: [50], trials: 1000, seed: 3 },
    });
    const cells = r.last.run.result.cells;
    expect(cells.map((c: { estimator: string }) => c.estimator)).toContain("stringer");
    expect(cells.find((c: { estimator: string }) => c.estimator === "stringer").interval).toBeGreaterThan(0);
  });

  it("can be cancelled while it runs", async () => {
    const res = await callRaw(advisor.POST, "POST", {
      as: senior,
      params: at(ratioSample),
      body: { scenario, sampleSizes: [1000, 2000, 2500], trials: 50000 },
    });
    const reader = res.body!.getReader();
    const decoder = new TextDecoder();
    let text = "";
    while (!text.includes("\n")) text += decoder.decode((await reader.read()).value, { stream: true });
    const started = JSON.parse(text.split("\n")[0]);
    expect(started.type).toBe("started");
    const cancel = await callRaw(advisorRun.DELETE, "DELETE", {
      as: senior,
      params: at(ratioSample, { runId: String(started.runId) }),
    });
    expect(cancel.status).toBe(204);
    for (let chunk = await reader.read(); !chunk.done; chunk = await reader.read())
      text += decoder.decode(chunk.value, { stream: true });
    expect(JSON.parse(text.trim().split("\n").at(-1)!)).toEqual({ type: "cancelled", runId: started.runId });
    const stored = await call(advisorRun.GET, "GET", {
      as: senior,
      params: at(ratioSample, { runId: String(started.runId) }),
    });
    expect(stored.json.run.status).toBe("cancelled");
    expect(
      (
        await callRaw(advisorRun.DELETE, "DELETE", {
          as: senior,
          params: at(ratioSample, { runId: String(started.runId) }),
        })
      ).status,
    ).toBe(409);
  });

  it("is cancelled from another app server through the flag in the database, which the running server polls", async () => {
    const res = await callRaw(advisor.POST, "POST", {
      as: senior,
      params: at(ratioSample),
      body: { scenario, sampleSizes: [1000, 2000, 2500], trials: 50000 },
    });
    const reader = res.body!.getReader();
    const decoder = new TextDecoder();
    let text = "";
    while (!text.includes("\n")) text += decoder.decode((await reader.read()).value, { stream: true });
    const runId = JSON.parse(text.split("\n")[0]).runId as number;
    // What DELETE does on a server that is not running the run: only the flag (no local worker to stop).
    const askedAt = performance.now();
    expect(await requestAdvisorCancel(getDb(), { runId })).toBe(true);
    for (let chunk = await reader.read(); !chunk.done; chunk = await reader.read())
      text += decoder.decode(chunk.value, { stream: true });
    expect(JSON.parse(text.trim().split("\n").at(-1)!)).toEqual({ type: "cancelled", runId });
    expect(performance.now() - askedAt).toBeLessThan(5_000); // polled every second
    expect((await getDb()("advisor_runs").where({ id: runId }).first("status"))!.status).toBe("cancelled");
  });

  it("leaves another live server's run alone when read, and marks one whose heartbeat stopped as interrupted", async () => {
    const make = async (heartbeatAgo: number) => {
      const [id] = await getDb()("advisor_runs").insert({
        engagement_id: engagement,
        sample_id: ratioSample,
        population_id: populationId,
        plan_version: 1,
        cache_key: "x".repeat(64),
        // A request as the advisor stores it (read back through its schema).
        request_json: JSON.stringify({
          scenario: { kind: "pattern", misstatedShare: 0.1, tainting: "spread", overstatementShare: 1 },
          scenarioSource: { kind: "pattern" },
          sampleSizes: [30],
          trials: 100,
          seed: 1,
          seedSource: "entered",
          confidence: 0.95,
          sides: "two",
          method: "random",
          plannedSize: 30,
        }),
        created_by: senior,
        server_id: "another-server",
        heartbeat_at: getDb().raw(`NOW(3) - INTERVAL ${heartbeatAgo} SECOND`),
      });
      return (await call(advisorRun.GET, "GET", { as: senior, params: at(ratioSample, { runId: String(id) }) })).json
        .run;
    };
    expect((await make(2)).status).toBe("running");
    const dead = await make(ADVISOR_HEARTBEAT_SECONDS + 5);
    expect(dead.status).toBe("failed");
    expect(dead.error).toMatch(/Interrupted/);
  });

  it("runs at most two simulations at once per server, answering 503 with the reason", async () => {
    const long = { scenario, sampleSizes: [1000, 2000, 2500], trials: 50000 };
    const starts = await Promise.all(
      [0, 1].map(async () => {
        const res = await callRaw(advisor.POST, "POST", { as: senior, params: at(ratioSample), body: long });
        const reader = res.body!.getReader();
        const first = new TextDecoder().decode((await reader.read()).value);
        return { reader, runId: JSON.parse(first.split("\n")[0]).runId as number };
      }),
    );
    const third = await call(advisor.POST, "POST", { as: senior, params: at(ratioSample), body: long });
    expect(third.status).toBe(503);
    expect(third.json.error.message).toMatch(
      /already running 2 simulations on this server \(the limit is per app server\)/,
    );
    for (const s of starts) {
      expect(
        (
          await callRaw(advisorRun.DELETE, "DELETE", {
            as: senior,
            params: at(ratioSample, { runId: String(s.runId) }),
          })
        ).status,
      ).toBe(204);
      while (!(await s.reader.read()).done);
    }
  });

  it("404 for another engagement's user, 403 below senior, 400 naming the field", async () => {
    expect(
      (
        await call(advisor.POST, "POST", {
          as: outsider,
          params: at(ratioSample),
          body: { scenario, sampleSizes: [30] },
        })
      ).status,
    ).toBe(404);
    expect((await call(advisor.GET, "GET", { as: outsider, params: at(ratioSample) })).status).toBe(404);
    expect(
      (await call(advisor.POST, "POST", { as: staff, params: at(ratioSample), body: { scenario, sampleSizes: [30] } }))
        .status,
    ).toBe(403);
    const big = await call(advisor.POST, "POST", {
      as: senior,
      params: at(ratioSample),
      body: { scenario, sampleSizes: [N + 1] },
    });
    expect(big.status).toBe(400);
    expect(big.json.error.fields.sampleSizes[0]).toMatch(/^3,001 is more than the population's 3,000 items$/);
    const share = await call(advisor.POST, "POST", {
      as: senior,
      params: at(ratioSample),
      body: { scenario: { ...scenario, misstatedPercent: 150 }, sampleSizes: [30] },
    });
    expect(share.status).toBe(400);
    expect(share.json.error.fields["scenario.misstatedPercent"][0]).toMatch(/at most 100%/);
    const noResults = await call(advisor.POST, "POST", {
      as: senior,
      params: at(ratioSample),
      body: { scenario: { kind: "previous-sample", sampleId: musSample }, sampleSizes: [30] },
    });
    expect(noResults.status).toBe(409);
    expect(noResults.json.error.message).toMatch(/no recorded audited values/);
  });

  it("adopts a finished run as the plan's rationale, and refuses new runs once the sample is drawn", async () => {
    const list = await call(advisor.GET, "GET", { as: staff, params: at(ratioSample) });
    expect(list.json.canRun).toBe(true);
    const done = list.json.runs.find((r: { status: string }) => r.status === "done");
    const cancelled = list.json.runs.find((r: { status: string }) => r.status === "cancelled");
    expect(
      (
        await call(adopt.POST, "POST", {
          as: senior,
          params: at(ratioSample, { runId: String(cancelled.id) }),
          body: {},
        })
      ).status,
    ).toBe(409);
    expect(
      (await call(adopt.POST, "POST", { as: staff, params: at(ratioSample, { runId: String(done.id) }), body: {} }))
        .status,
    ).toBe(403);
    // A run that did not simulate the plan's estimator (runs made before ratio forms were simulated with
    // non-positive items looked like this) cannot be kept.
    const stored = (await getDb()("advisor_runs").where({ id: done.id }).first())!;
    const withoutRatio = typeof stored.result_json === "string" ? JSON.parse(stored.result_json) : stored.result_json;
    withoutRatio.cells = withoutRatio.cells.filter((c: { estimator: string }) => c.estimator !== "ratio");
    const [skipped] = await getDb()("advisor_runs").insert({
      ...stored,
      id: undefined,
      result_json: JSON.stringify(withoutRatio),
      request_json: typeof stored.request_json === "string" ? stored.request_json : JSON.stringify(stored.request_json),
    });
    const refused = await call(adopt.POST, "POST", {
      as: senior,
      params: at(ratioSample, { runId: String(skipped) }),
      body: { reason: "any" },
    });
    expect(refused.status).toBe(409);
    expect(refused.json.error.message).toMatch(/did not simulate the plan's estimator \(ratio\)/);
    const full = await call(advisorRun.GET, "GET", { as: staff, params: at(ratioSample, { runId: String(done.id) }) });
    if (full.json.run.result.recommendation.recommended !== "ratio") {
      // Recommends another estimator (or none): kept only with a written reason, naming the field.
      const noReason = await call(adopt.POST, "POST", {
        as: senior,
        params: at(ratioSample, { runId: String(done.id) }),
        body: {},
      });
      expect(noReason.status).toBe(400);
      expect(noReason.json.error.fields).toHaveProperty("reason");
    }
    const ok = await call(adopt.POST, "POST", {
      as: senior,
      params: at(ratioSample, { runId: String(done.id) }),
      body: { reason: "Ratio kept: the ledger's misstatements are proportional to book value." },
    });
    expect(ok.status).toBe(200);
    expect(ok.json.adopted.id).toBe(done.id);
    expect(ok.json.adopted.keptReason).toBe("Ratio kept: the ledger's misstatements are proportional to book value.");
    expect(ok.json.adopted.result.recommendation).toBeTruthy();
    expect(await auditCount({ entity: "sample", action: "adopt-advisor-run" })).toBe(1);
    expect((await drawSample(senior, engagement, ratioSample, 11)).status).toBe(201);
    const after = await call(advisor.POST, "POST", {
      as: senior,
      params: at(ratioSample),
      body: { scenario, sampleSizes: [30] },
    });
    expect(after.status).toBe(409);
    expect((await call(advisor.GET, "GET", { as: staff, params: at(ratioSample) })).json.canRun).toBe(false);
  });

  it("borrows the misstatements found in an earlier sample", async () => {
    const items = await listSampleItems(senior, engagement, ratioSample);
    const [a, b, c] = items;
    await saveResult(staff, engagement, ratioSample, a.id, {
      version: a.version,
      status: "done",
      auditedValue: a.bookValue,
    });
    await saveResult(staff, engagement, ratioSample, b.id, {
      version: b.version,
      status: "done",
      auditedValue: (Number(b.bookValue) / 2).toFixed(2),
      cause: "pricing",
    });
    await saveResult(staff, engagement, ratioSample, c.id, {
      version: c.version,
      status: "not-auditable",
      comment: "no evidence",
    });
    const r = await callEvents(advisor.POST, "POST", {
      as: senior,
      params: at(musSample),
      body: { scenario: { kind: "previous-sample", sampleId: ratioSample }, sampleSizes: [40], trials: 500, seed: 5 },
    });
    expect(r.last.type).toBe("result");
    const request = r.last.run.request;
    expect(request.scenarioSource).toMatchObject({ kind: "previous-sample", sampleId: ratioSample, results: 3 });
    // The unauditable item counts as wholly misstated, as in the evaluation.
    expect(request.scenario.misstatedShare).toBeCloseTo(2 / 3, 12);
    expect(request.scenario.taintings).toHaveLength(2);
    expect(request.scenario.taintings[0]).toBeCloseTo(0.5, 2);
    expect(request.scenario.taintings[1]).toBe(1);
    const misstated = r.last.run.result.truth.misstatedItems / N;
    expect(Math.abs(misstated - 2 / 3)).toBeLessThan(4 * Math.sqrt(((2 / 3) * (1 / 3)) / N)); // binomial, 4 SE (common practice)
  });
});
