import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { createRng } from "@/lib/sampling";
import { DEFAULT_METHODOLOGY } from "@/lib/validation/methodology";
import { call, callRaw } from "./support/call";
import { auditCount, makeEngagement, makeFirm, makeUser } from "./support/factory";
import {
  CANONICAL_CSV,
  drawSample,
  getEvaluation,
  listSampleItems,
  loadCanonicalPopulation,
  planSample,
  saveResult,
} from "./support/samples";
import * as methodology from "@/app/api/firm/methodology/route";
import * as picks from "@/app/api/engagements/[engagementId]/samples/[sampleId]/picks/route";
import * as pick from "@/app/api/engagements/[engagementId]/samples/[sampleId]/picks/[itemId]/route";
import * as anomaly from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/[itemId]/anomaly/route";
import * as acceptance from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/[itemId]/anomaly/acceptance/route";
import * as reperform from "@/app/api/engagements/[engagementId]/samples/[sampleId]/reperform/route";
import * as workpaper from "@/app/api/engagements/[engagementId]/samples/[sampleId]/workpaper/route";
import * as workbook from "@/app/api/engagements/[engagementId]/samples/[sampleId]/workbook/route";
import ExcelJS from "exceljs";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let firm: number,
  admin: number,
  manager: number,
  senior: number,
  staff: number,
  engagement: number,
  populationId: number;
const book = CANONICAL_CSV.trim()
  .split("\n")
  .slice(1)
  .map((l, i) => ({ ref: l.split(",")[0], value: Number(l.split(",")[1]), row: i + 2 }));

beforeAll(async () => {
  firm = await makeFirm();
  admin = await makeUser(firm, "staff", { admin: true });
  [manager, senior, staff] = await Promise.all([
    makeUser(firm, "manager"),
    makeUser(firm, "senior"),
    makeUser(firm, "staff"),
  ]);
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

const sp = (sampleId: number, extra: Record<string, string> = {}) => ({
  engagementId: String(engagement),
  sampleId: String(sampleId),
  ...extra,
});
// Key items: the threshold 4,000 catches INV006 (12,500.00) and INV011 (4,100.00); INV004 (3,625.75) is chosen with a reason.
const KEY = {
  keyItemThreshold: "4000",
  keyItems: [{ itemRef: "INV004", reason: "Credit note raised after the period end" }],
};
const nonstatistical = (extra: Record<string, unknown> = {}) => ({
  method: "nonstatistical",
  sizingBasis: "risk-assessment",
  assessedRisk: "maximum",
  otherProceduresRisk: "moderate",
  tolerableMisstatement: "5000",
  expectedMisstatement: "0",
  projection: "ratio",
  selection: "random",
  ...KEY,
  ...extra,
});

describe("nonstatistical samples", () => {
  it("sizes from the two assessed risks through the firm's table: n = ⌈(BV − key items) ÷ TM × factor⌉", async () => {
    const r = await planSample(senior, engagement, { populationId, params: nonstatistical() });
    expect(r.status).toBe(201);
    const plan = r.json.sample.plan;
    // Shipped table (from memory): RMM maximum × other procedures moderate → 2.3; confidence 1 − e^(−2.3) = 0.8997 (common practice).
    expect(plan.risk).toMatchObject({
      basis: "risk-assessment",
      assessedRisk: "maximum",
      otherProceduresRisk: "moderate",
      tableFactor: 2.3,
      factor: 2.3,
      tableVersion: 0,
    });
    expect(r.json.sample.params.confidence).toBeCloseTo(0.8997, 4);
    expect(plan.keyItems).toMatchObject({ count: 3, total: "20225.75", remainder: { count: 17, total: "17314.21" } });
    expect(plan.keyItems.items.map((k: { itemRef: string; basis: string }) => `${k.itemRef}:${k.basis}`)).toEqual([
      "INV004:chosen",
      "INV006:threshold",
      "INV011:threshold",
    ]);
    // (37,539.96 − 20,225.75) ÷ 5,000 × 2.3 = 7.9645… → 8 (formula arithmetic)
    expect(plan.computedSize).toBe(8);
    expect(plan.inputs).toMatchObject({
      BV: "37539.96",
      "key items' BV": "20225.75",
      TM: "5000.00",
      "assurance factor": 2.3,
    });
  });

  it("refuses block selection with the reason, a typed confidence without a reason, and an unknown key item — naming the field", async () => {
    const block = await planSample(senior, engagement, {
      populationId,
      params: nonstatistical({ selection: "block" }),
    });
    expect(block.status).toBe(400);
    expect(block.json.error.fields["params.selection"][0]).toMatch(/rarely representative.*ISA 530, Appendix 4\(e\)/);
    const typed = await planSample(senior, engagement, {
      populationId,
      params: nonstatistical({ sizingBasis: "confidence-override", confidence: 0.9 }),
    });
    expect(typed.status).toBe(400);
    expect(Object.keys(typed.json.error.fields)).toContain("params.confidenceReason");
    const unknown = await planSample(senior, engagement, {
      populationId,
      params: nonstatistical({ keyItems: [{ itemRef: "NOPE", reason: "Typed wrongly" }] }),
    });
    expect(unknown.status).toBe(400);
    expect(unknown.json.error.fields["keyItems.0.itemRef"][0]).toMatch(/No item NOPE/);
    const count = Number((await getDb()("samples").where({ engagement_id: engagement }).count({ n: "*" }).first())?.n);
    expect(count).toBe(1); // only the sample of the first test
  });

  it("a typed confidence with a reason overrides the table: factor −ln(1 − c)", async () => {
    const r = await planSample(senior, engagement, {
      populationId,
      params: nonstatistical({
        sizingBasis: "confidence-override",
        confidence: 0.95,
        confidenceReason: "Group auditor's instruction",
      }),
    });
    expect(r.status).toBe(201);
    // −ln(0.05) = 2.9957 (common practice); 17,314.21 ÷ 5,000 × 2.9957 = 10.37 → 11
    expect(r.json.sample.plan.risk).toMatchObject({
      basis: "confidence-override",
      factor: 2.9957,
      overrideReason: "Group auditor's instruction",
      tableFactor: 2.3,
    });
    expect(r.json.sample.plan.computedSize).toBe(11);
  });

  it("draws the key items first and the rest by random-number sort on the remainder; re-performs; evaluates by ratio projection + key items", async () => {
    const r = await planSample(senior, engagement, { populationId, params: nonstatistical() });
    const id = r.json.sample.id as number;
    expect((await drawSample(senior, engagement, id, 5489)).status).toBe(201);
    const items = await listSampleItems(staff, engagement, id);
    expect(items.slice(0, 3).map((i) => i.itemRef)).toEqual(["INV004", "INV006", "INV011"]);
    // SAMPLING-ENGINE §2 random-number sort over the remainder frame (population order without the key items).
    const remainder = book.filter((b) => !["INV004", "INV006", "INV011"].includes(b.ref));
    const rng = createRng(5489);
    const expected = remainder
      .map((b) => ({ ref: b.ref, u: rng.nextDouble() }))
      .sort((a, b) => a.u - b.u)
      .slice(0, 8)
      .map((x) => x.ref);
    expect(items.slice(3).map((i) => i.itemRef)).toEqual(expected);
    const again = await call(reperform.POST, "POST", { as: staff, params: sp(id), body: {} });
    expect(again.json.reperform.matches).toBe(true);

    // The fieldwork workbook says how each item came into the sample: key items (with the auditor's reason) apart from the sample.
    const xlsx = await callRaw(workbook.GET, "GET", { as: staff, params: sp(id) });
    expect(xlsx.status).toBe(200);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(await xlsx.arrayBuffer());
    const sheet = wb.getWorksheet("Items")!;
    const header = (sheet.getRow(1).values as unknown[]).map(String);
    const selectedAs = new Map<string, string>();
    sheet.eachRow((row, n) => {
      if (n > 1)
        selectedAs.set(
          row.getCell(header.indexOf("Item reference")).text,
          row.getCell(header.indexOf("Selected as")).text,
        );
    });
    expect(selectedAs.get("INV004")).toBe("Key item (examined 100 %): Credit note raised after the period end");
    expect(selectedAs.get("INV006")).toBe("Key item (examined 100 %)");
    expect(selectedAs.get("INV011")).toBe("Key item (examined 100 %)");
    expect(expected.map((ref) => selectedAs.get(ref))).toEqual(expected.map(() => "Sample"));

    // Results: one key item overstated by 100.00, one sampled item (the first above zero) overstated by 10 % of its book value.
    const misstated = items.slice(3).find((i) => Number(i.bookValue) > 0)!;
    for (const it of items) {
      const audited =
        it.itemRef === "INV006" ? 12400 : it.id === misstated.id ? Number(it.bookValue) * 0.9 : Number(it.bookValue);
      expect(
        (
          await saveResult(staff, engagement, id, it.id, {
            version: it.version,
            status: "done",
            auditedValue: audited.toFixed(2),
          })
        ).status,
      ).toBe(200);
    }
    const e = await getEvaluation(staff, engagement, id);
    const sampled = items.slice(3);
    const sampledBook = sampled.reduce((s, i) => s + Math.round(Number(i.bookValue) * 100), 0) / 100;
    const miss = Math.round(Number(misstated.bookValue) * 10) / 100;
    // Ratio method (AS 2315.26; AICPA Audit Guide): misstatement ÷ sampled book × remainder book (17,314.21), plus key items at actual (100.00).
    const projected = Math.round((miss / sampledBook) * 17314.21 * 100) / 100;
    const b = e.block;
    expect(b.method).toBe("nonstatistical");
    expect(Number(b.projectedMisstatement)).toBeCloseTo(projected, 2);
    expect(b.keyItems).toEqual({ planned: 3, evaluated: 3, misstatement: "100.00" });
    expect(Number(e.projectedMisstatement)).toBeCloseTo(projected + 100, 2);
    expect(b).not.toHaveProperty("upperLimit"); // no statistical bound is claimed
    // EM was 0, so any misstatement is above the "well below" amount: not well below TM, an unacceptably high risk (AS 2315.26).
    expect(b.verdict).toBe("approaches");
    expect(b.statement).toMatch(/not well below it/);
    expect(e.computed).toMatchObject({ status: "not-supported", supported: false, responseNeeded: true });
    expect(b.responses.length).toBeGreaterThan(2);
    expect(e.warnings.join(" ")).toMatch(/no statistical bound/i);
  });

  it("haphazard: the draw holds only the key items; a senior picks the rest on the grid, recorded with who and when", async () => {
    const r = await planSample(senior, engagement, {
      populationId,
      params: nonstatistical({ selection: "haphazard", projection: "difference" }),
    });
    const id = r.json.sample.id as number;
    expect((await drawSample(senior, engagement, id, 7)).status).toBe(400); // no seed for a haphazard selection
    expect((await drawSample(senior, engagement, id)).status).toBe(201);
    expect((await listSampleItems(staff, engagement, id)).map((i) => i.itemRef)).toEqual([
      "INV004",
      "INV006",
      "INV011",
    ]);
    const draw = (await getDb()("sample_draws").where({ sample_id: id }).first("seed_source"))!;
    expect(draw.seed_source).toBe("haphazard");

    const rowOf = (ref: string) => book.find((b) => b.ref === ref)!.row;
    expect(
      (await call(picks.POST, "POST", { as: staff, params: sp(id), body: { rowNumber: rowOf("INV001") } })).status,
    ).toBe(403);
    expect((await call(picks.POST, "POST", { as: senior, params: sp(id), body: { rowNumber: "x" } })).status).toBe(400);
    expect(
      (await call(picks.POST, "POST", { as: senior, params: sp(id), body: { rowNumber: rowOf("INV006") } })).status,
    ).toBe(409); // a key item
    const picked = ["INV001", "INV002", "INV005", "INV009", "INV013", "INV015", "INV018", "INV020"];
    for (const ref of picked)
      expect(
        (await call(picks.POST, "POST", { as: senior, params: sp(id), body: { rowNumber: rowOf(ref) } })).status,
      ).toBe(201);
    expect(
      (await call(picks.POST, "POST", { as: senior, params: sp(id), body: { rowNumber: rowOf("INV001") } })).status,
    ).toBe(409); // twice
    expect(
      (await call(picks.POST, "POST", { as: senior, params: sp(id), body: { rowNumber: rowOf("INV017") } })).json.error
        .message,
    ).toMatch(/all picked/);
    expect(await auditCount({ action: "haphazard-pick", sample_id: id })).toBe(8);

    const items = await listSampleItems(staff, engagement, id);
    const first = items.find((i) => i.itemRef === "INV001")!;
    expect(first).toMatchObject({
      origin: "haphazard",
      pickedByName: expect.any(String) as string,
      pickedAt: expect.any(String) as string,
    });
    expect(
      (await call(pick.DELETE, "DELETE", { as: senior, params: sp(id, { itemId: String(first.id) }), body: {} }))
        .status,
    ).toBe(200);
    expect(
      (await call(picks.POST, "POST", { as: senior, params: sp(id), body: { rowNumber: rowOf("INV017") } })).status,
    ).toBe(201);
    // Re-performing a haphazard draw checks what a seed can: the key items set by the plan.
    expect((await call(reperform.POST, "POST", { as: staff, params: sp(id), body: {} })).json.reperform.matches).toBe(
      true,
    );

    // Difference method (PCAOB AS 2315.26): misstatement per sampled item × remainder items (17).
    const now = await listSampleItems(staff, engagement, id);
    const target = now.find((i) => i.itemRef === "INV009")!;
    for (const it of now) {
      const audited = it.id === target.id ? Number(it.bookValue) - 80 : Number(it.bookValue);
      await saveResult(staff, engagement, id, it.id, {
        version: it.version,
        status: "done",
        auditedValue: audited.toFixed(2),
      });
    }
    const e = await getEvaluation(staff, engagement, id);
    expect(e.block.projection).toBe("difference");
    expect(e.block.projectedMisstatement).toBe("170.00"); // 80 ÷ 8 × 17
    expect(e.warnings.join(" ")).toMatch(/cannot be re-performed from a seed/);

    // Anomaly: a short justification is refused; staff cannot accept; a manager can; the evaluation then takes it at actual.
    const aParams = sp(id, { itemId: String(target.id) });
    expect(
      (await call(anomaly.POST, "POST", { as: staff, params: aParams, body: { justification: "rare" } })).status,
    ).toBe(400);
    expect(
      (
        await call(anomaly.POST, "POST", {
          as: staff,
          params: aParams,
          body: {
            justification:
              "A one-off system migration error, fixed on 3 July and confirmed by reprocessing every invoice since.",
          },
        })
      ).status,
    ).toBe(200);
    expect((await call(acceptance.POST, "POST", { as: staff, params: aParams, body: { confirm: true } })).status).toBe(
      403,
    );
    expect((await getEvaluation(staff, engagement, id)).block.anomalies.count).toBe(0); // not yet accepted
    expect(
      (await call(acceptance.POST, "POST", { as: manager, params: aParams, body: { confirm: true } })).status,
    ).toBe(200);
    const withAnomaly = await getEvaluation(staff, engagement, id);
    expect(withAnomaly.block.projectedMisstatement).toBe("0.00");
    expect(withAnomaly.block.anomalies).toEqual({ count: 1, misstatement: "80.00" });
    expect(withAnomaly.projectedMisstatement).toBe("80.00");
    expect(await auditCount({ action: "anomaly-accept", sample_id: id })).toBe(1);

    const pdf = await callRaw(workpaper.GET, "GET", { as: staff, params: sp(id) });
    expect(pdf.status).toBe(200);
    expect(pdf.headers.get("content-type")).toContain("application/pdf");
    const file = path.join(os.tmpdir(), `sondage-nonstatistical-${id}.pdf`);
    fs.writeFileSync(file, Buffer.from(await pdf.arrayBuffer()));
    const text = execFileSync("pdftotext", [file, "-"], { encoding: "utf8" }).replace(/\s+/g, " ");
    expect(text).toContain("cannot be re-performed by a seed");
    expect(text).toMatch(/Assessed risk of material misstatement Maximum/);
    expect(text).toMatch(/factor 2\.30/);
    expect(text).toContain("Table version shipped defaults (version 0");
    expect(text).toContain("Credit note raised after the period end"); // the chosen key item's reason
    expect(text).toContain("Haphazard picks (8)");
    expect(text).toContain("Excluded from the projection; added at its actual amount");
    expect(text).toContain("A nonstatistical sample has no statistical bound");

    // A later change of the item's result clears the mark and its acceptance.
    const fresh = (await listSampleItems(staff, engagement, id)).find((i) => i.id === target.id)!;
    expect(
      (
        await saveResult(staff, engagement, id, target.id, {
          version: fresh.version,
          status: "done",
          auditedValue: (Number(target.bookValue) - 50).toFixed(2),
        })
      ).status,
    ).toBe(200);
    const cleared = await getEvaluation(staff, engagement, id);
    expect(cleared.block.anomalies.count).toBe(0);
    expect(cleared.block.projectedMisstatement).toBe("106.25"); // 50 ÷ 8 × 17
  });

  it("plans stamped with a firm setting that forbids anomalies refuse the mark; the firm's table change applies to new plans only", async () => {
    const old = await planSample(senior, engagement, { populationId, params: nonstatistical() });
    const changedTable = DEFAULT_METHODOLOGY.assuranceFactors.map((row, i) =>
      row.map((cell, j) => (i === 0 && j === 2 ? { factor: 2.5, confidence: 0.9179 } : cell)),
    );
    expect(
      (
        await call(methodology.PUT, "PUT", {
          as: admin,
          body: { ...DEFAULT_METHODOLOGY, assuranceFactors: changedTable, anomaliesAllowed: false },
        })
      ).status,
    ).toBe(200);
    const r = await planSample(senior, engagement, {
      populationId,
      params: nonstatistical({ keyItems: undefined, keyItemThreshold: undefined }),
    });
    // 37,539.96 ÷ 5,000 × 2.5 = 18.77 → 19 with the firm's own factor (version 1)
    expect(r.json.sample.plan.risk).toMatchObject({ factor: 2.5, tableVersion: 1 });
    expect(r.json.sample.plan.computedSize).toBe(19);
    const id = r.json.sample.id as number;
    await drawSample(senior, engagement, id, 99);
    const [it] = await listSampleItems(staff, engagement, id);
    await saveResult(staff, engagement, id, it.id, { version: it.version, status: "not-auditable" });
    const refused = await call(anomaly.POST, "POST", {
      as: staff,
      params: sp(id, { itemId: String(it.id) }),
      body: { justification: "A one-off error that cannot recur, with evidence on file." },
    });
    expect(refused.status).toBe(409);
    expect(refused.json.error.message).toMatch(/does not allow anomalous/);
    const stillOld = (await getDb()("samples")
      .where({ id: old.json.sample.id })
      .first("plan_json", "methodology_version"))!;
    expect(
      JSON.parse(typeof stillOld.plan_json === "string" ? stillOld.plan_json : JSON.stringify(stillOld.plan_json))
        .computedSize,
    ).toBe(8);
    expect(stillOld.methodology_version).toBe(0);
  });
});

describe("key items for classical plans (issue 14 §4)", () => {
  it("sizes and draws a random sample on the remainder and adds the key items' actual misstatement to the projection and bounds", async () => {
    const r = await planSample(senior, engagement, {
      populationId,
      params: {
        method: "random",
        estimator: "difference",
        confidence: 0.95,
        riskOfIncorrectRejection: 0.1,
        tolerableMisstatement: "6000",
        sampleSize: 8,
        sizeReason: "test",
        ...KEY,
      },
    });
    expect(r.status).toBe(201);
    expect(r.json.sample.plan.frameSize).toBe(17);
    const id = r.json.sample.id as number;
    await drawSample(senior, engagement, id, 5489);
    const items = await listSampleItems(staff, engagement, id);
    expect(items.filter((i) => (i as unknown as { keyItem: boolean }).keyItem).map((i) => i.itemRef)).toEqual([
      "INV004",
      "INV006",
      "INV011",
    ]);
    for (const it of items) {
      const audited = it.itemRef === "INV011" ? 4000 : Number(it.bookValue); // key item overstated by 100.00; sample clean
      await saveResult(staff, engagement, id, it.id, {
        version: it.version,
        status: "done",
        auditedValue: audited.toFixed(2),
      });
    }
    const e = await getEvaluation(staff, engagement, id);
    // Difference estimator with no differences in the sample projects 0 on the remainder (Cochran 1977 §6.7); + 100.00 at actual.
    expect(e.block.projectedMisstatement).toBe("100.00");
    expect(e.block.estimatedAuditedValue).toBe((37539.96 - 100).toFixed(2));
    expect(e.block.populationBookValue).toBe("37539.96");
    expect(e.block.atActual).toMatchObject({
      remainderSize: 17,
      keyItems: { count: 3, misstatement: "100.00" },
      anomalies: { count: 0 },
    });
    expect(e.warnings.join(" ")).toMatch(/Key items and accepted anomalies add 100.00/);
  });
});
