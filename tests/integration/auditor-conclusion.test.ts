/**
 * Issue 13 §3 and §6: the computed result is not the auditor's conclusion. Provisional wording until
 * every item has a result; the preparer records a conclusion and response (400 naming the field, 403
 * for reviewers, 409 too early); sign-off needs them; result changes clear them; the engagement's
 * responses can be listed for the summary of misstatements; unaudited items count in the direction tested.
 */
import ExcelJS from "exceljs";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { listResponsesByEngagementId } from "@/lib/data/auditor-conclusions";
import { buildLiveSummary } from "@/lib/misstatements/summary-view";
import { call, callRaw } from "./support/call";
import { auditCount, makeEngagement, makeFirm, makeUser } from "./support/factory";
import {
  concludeSample,
  drawSample,
  getEvaluation,
  listSampleItems,
  loadCanonicalPopulation,
  planSample,
  saveResult,
} from "./support/samples";
import * as conclusion from "@/app/api/engagements/[engagementId]/samples/[sampleId]/conclusion/route";
import * as signOff from "@/app/api/engagements/[engagementId]/samples/[sampleId]/sign-off/route";
import * as workbook from "@/app/api/engagements/[engagementId]/samples/[sampleId]/workbook/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let staff: number, senior: number, manager: number, engagement: number, populationId: number, sampleId: number;
const p = () => ({ engagementId: String(engagement), sampleId: String(sampleId) });

beforeAll(async () => {
  const firm = await makeFirm();
  [staff, senior, manager] = await Promise.all([
    makeUser(firm, "staff"),
    makeUser(firm, "senior"),
    makeUser(firm, "manager"),
  ]);
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
    [staff, "staff"],
  ]);
  populationId = (await loadCanonicalPopulation(senior, engagement)).populationId;
  // TM 15,000 with interval 4,744 (AICPA 95% table factors): the upper limit lands close to or above TM, so a response is called for.
  sampleId = (
    await planSample(senior, engagement, {
      populationId,
      params: { method: "mus", tolerableMisstatement: "15000", factorMode: "table" },
    })
  ).json.sample.id;
  await drawSample(senior, engagement, sampleId, 1206281);
});

afterAll(async () => {
  await getDb().destroy();
});

describe("the computed result", () => {
  it("is provisional, and says on how many items, until every item has a result", async () => {
    const [first] = await listSampleItems(staff, engagement, sampleId);
    await saveResult(staff, engagement, sampleId, first.id, {
      version: first.version,
      status: "done",
      auditedValue: first.bookValue,
    });
    const ev = await getEvaluation(staff, engagement, sampleId);
    expect(ev.computed.status).toBe("provisional");
    expect(ev.computed.supported).toBeNull();
    expect(ev.computed.statement).toMatch(
      new RegExp(`^Provisional, on 1 of ${ev.progress.total} items: the upper misstatement limit so far \\(gross\\)`),
    );
    expect(ev.computed.statement).not.toMatch(/supports|does not support/);
  });
});

describe("the auditor's conclusion and response", () => {
  it("is refused (409) until every item has a result", async () => {
    const r = await concludeSample(staff, engagement, sampleId);
    expect(r.status).toBe(409);
    expect(r.json.error.message).toMatch(/have no result yet/);
  });

  it("answers 400 naming the field for bad input, and stores nothing", async () => {
    for (const it of await listSampleItems(staff, engagement, sampleId)) {
      if (it.status === "not-started")
        await saveResult(staff, engagement, sampleId, it.id, {
          version: it.version,
          status: "done",
          auditedValue: it.itemRef === "INV011" ? "3690.00" : it.bookValue,
        });
    }
    const short = await concludeSample(staff, engagement, sampleId, { conclusion: "ok" });
    expect(short.status).toBe(400);
    expect(short.json.error.fields).toHaveProperty("conclusion");
    const noAmount = await concludeSample(staff, engagement, sampleId, {
      responses: [{ kind: "ask-client-to-adjust" }],
    });
    expect(noAmount.status).toBe(400);
    expect(JSON.stringify(noAmount.json.error.fields)).toMatch(/responses/);
    const badKind = await concludeSample(staff, engagement, sampleId, { responses: [{ kind: "ignore-it" }] });
    expect(badKind.status).toBe(400);
    expect((await call(conclusion.GET, "GET", { as: staff, params: p() })).json.conclusion).toBeNull();
  });

  it("needs a response when the computed result calls for one (400 naming responses)", async () => {
    const ev = await getEvaluation(staff, engagement, sampleId);
    expect(ev.computed.responseNeeded).toBe(true);
    const r = await concludeSample(staff, engagement, sampleId, { responses: [] });
    expect(r.status).toBe(400);
    expect(r.json.error.fields).toHaveProperty("responses");
  });

  it("is written by the preparer only (403 for a manager), audited, and read back with who and when", async () => {
    expect((await concludeSample(manager, engagement, sampleId)).status).toBe(403);
    const before = await auditCount({ action: "auditor-conclusion", sample_id: sampleId });
    const r = await concludeSample(senior, engagement, sampleId, {
      responses: [
        { kind: "conclude-misstated", amount: "410.00", note: "Cut-off error on INV011" },
        { kind: "alternative-procedures" },
      ],
    });
    expect(r.status).toBe(200);
    expect(r.json.conclusion).toMatchObject({
      writtenBy: { id: senior, role: "senior" },
      responses: [
        { kind: "conclude-misstated", amount: "410.00", note: "Cut-off error on INV011" },
        { kind: "alternative-procedures", amount: null, note: null },
      ],
    });
    expect(await auditCount({ action: "auditor-conclusion", sample_id: sampleId })).toBe(before + 1);
  });

  it("is listed for the engagement's summary of misstatements", async () => {
    const list = await listResponsesByEngagementId(getDb(), { engagementId: engagement });
    expect(list).toEqual([
      expect.objectContaining({
        sampleId,
        sampleName: "Test sample",
        method: "mus",
        reviewerSignedAt: null,
        responses: expect.arrayContaining([expect.objectContaining({ kind: "conclude-misstated", amount: "410.00" })]),
      }),
    ]);
  });

  it("carries the concluded amount into the summary of misstatements: the sample's rows add up to it", async () => {
    const summary = await buildLiveSummary(getDb(), { engagementId: engagement });
    const rows = summary.rows.filter((r) => r.sampleId === sampleId);
    const concluded = rows.find((r) => r.key === `s${sampleId}-concluded`);
    const cents = (a: string) => Math.round(Number(a) * 100);
    const projected = rows.filter((r) => r.kind !== "judgemental").reduce((t, r) => t + cents(r.amount), 0);
    expect(concluded).toMatchObject({ kind: "judgemental", amount: ((41000 - projected) / 100).toFixed(2) });
    expect(rows.reduce((t, r) => t + cents(r.amount), 0)).toBe(41000); // the auditor's 410.00
  });

  it("lets the preparer and then the reviewer sign off, and goes with the sign-offs when a result changes", async () => {
    expect((await call(signOff.POST, "POST", { as: staff, params: p(), body: { as: "preparer" } })).status).toBe(200);
    expect((await call(signOff.POST, "POST", { as: manager, params: p(), body: { as: "reviewer" } })).status).toBe(200);
    const [first] = await listSampleItems(staff, engagement, sampleId);
    const r = await saveResult(staff, engagement, sampleId, first.id, {
      version: first.version,
      status: "done",
      auditedValue: first.bookValue,
      comment: "Re-checked",
    });
    expect(r.status).toBe(200);
    expect((await call(conclusion.GET, "GET", { as: staff, params: p() })).json.conclusion).toBeNull();
    expect(await auditCount({ action: "auditor-conclusion-cleared", sample_id: sampleId })).toBe(1);
    expect((await call(signOff.POST, "POST", { as: staff, params: p(), body: { as: "preparer" } })).status).toBe(409);
  });
});

describe("an item that could not be audited", () => {
  it("counts as a full understatement in an understatement test, never as audited 0", async () => {
    const id = (
      await planSample(senior, engagement, {
        populationId,
        direction: "understatement",
        params: { method: "mus", tolerableMisstatement: "15000", factorMode: "table" },
      })
    ).json.sample.id as number;
    await drawSample(senior, engagement, id, 1206281);
    const items = await listSampleItems(staff, engagement, id);
    const target = items.find((i) => !i.topStratum)!;
    await saveResult(staff, engagement, id, target.id, {
      version: target.version,
      status: "not-auditable",
      comment: "No evidence",
    });
    const ev = await getEvaluation(staff, engagement, id);
    // Tainting 1 on the understatement side (audited = 2 × book), none on the overstatement side.
    expect(ev.block.understatement.rows).toEqual([
      expect.objectContaining({
        reference: target.itemRef,
        tainting: 1,
        auditedValue: (Number(target.bookValue) * 2).toFixed(2),
      }),
    ]);
    expect(ev.block.overstatement.rows).toEqual([]);
    expect(ev.notes[0]).toMatch(/understatement equal to its book value.*never as audited 0/);
    // The grid's row says the same treatment in a few words (ISA 530 ¶12, from memory: an item the procedures cannot be applied to is treated as a misstatement or a deviation).
    expect(ev.unauditableOnRow).toBe(
      "Evaluated as audited at twice its book value: an understatement equal to its book value.",
    );
    expect(ev.block.understatementCaution).toMatch(/understated items are less likely to be selected/);
    // Issue 19: the grid, the progress total and the workbook print the misstatement the evaluation counts
    // (book − audited with audited = 2 × book: minus the book value), never +book.
    const minusBook = (-Number(target.bookValue)).toFixed(2);
    const row = (await listSampleItems(staff, engagement, id)).find((i) => i.id === target.id)!;
    expect(row.misstatement).toBe(minusBook);
    expect(ev.progress.misstatementTotal).toBe(minusBook);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(
      await (await callRaw(workbook.GET, "GET", { as: staff, params: { ...p(), sampleId: String(id) } })).arrayBuffer(),
    );
    const ws = wb.getWorksheet("Items")!;
    const header: Record<string, number> = {};
    ws.getRow(1).eachCell((cell, col) => (header[cell.text] = col));
    const xlsxRow = ws.getRows(2, ws.rowCount - 1)!.find((r) => r.getCell(header["Item id"]).value === target.id)!;
    const cell = xlsxRow.getCell(header["Misstatement (book − audited)"]).value as { formula: string; result: number };
    expect(cell.result).toBe(Number(minusBook));
    expect(cell.formula).toMatch(/="Could not be audited",-ABS\(D\d+\)/);
    const plan = (await getDb()("samples").where({ id }).first("plan_json"))!.plan_json;
    expect(JSON.stringify(plan)).toMatch(/Understatement tested by monetary-unit sampling/);
  });
});
