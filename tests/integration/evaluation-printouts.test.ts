/**
 * Issue 13 §2: one evaluation view model, printed three times. The sample page (EvaluationPanel,
 * rendered to HTML), `GET …/evaluation` and the PDF workpaper must print the same figures: every
 * amount, factor and rate of the view model's block appears, formatted the same way, in the page's
 * text and in the PDF's text, and the page is rendered from the very object the API answers.
 */
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { EvaluationPanel } from "@/components/samples/evaluation-panel";
import type { SampleEvaluation } from "@/lib/samples/evaluate";
import { callRaw } from "./support/call";
import { makeEngagement, makeFirm, makeUser } from "./support/factory";
import {
  concludeSample,
  drawSample,
  getEvaluation,
  listSampleItems,
  loadCanonicalPopulation,
  planSample,
  saveResult,
} from "./support/samples";
import * as workpaper from "@/app/api/engagements/[engagementId]/samples/[sampleId]/workpaper/route";
import { formatFactor, formatMoney, formatRate } from "@/lib/format/number";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let staff: number, senior: number, engagement: number, populationId: number;

beforeAll(async () => {
  const firm = await makeFirm();
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

const MONEY = /^-?\d+\.\d{2}$/;

/** Every decimal-string amount in the block (the figures a reader checks), with where it sits. */
function amounts(value: unknown, at = "block"): [string, string][] {
  if (typeof value === "string") return MONEY.test(value) ? [[at, value]] : [];
  if (Array.isArray(value)) return value.flatMap((v, i) => amounts(v, `${at}[${i}]`));
  if (value && typeof value === "object") return Object.entries(value).flatMap(([k, v]) => amounts(v, `${at}.${k}`));
  return [];
}

const squash = (t: string) => t.replace(/\s+/g, " ");
const htmlText = (html: string) =>
  squash(
    html
      .replace(/<[^>]+>/g, " ")
      .replace(/&amp;/g, "&")
      .replace(/&#x27;|&apos;/g, "'")
      .replace(/&quot;/g, '"'),
  );

async function printouts(sampleId: number, direction: SampleEvaluation["direction"]) {
  const api = (await getEvaluation(staff, engagement, sampleId)) as SampleEvaluation;
  const page = htmlText(
    renderToStaticMarkup(createElement(EvaluationPanel, { evaluation: api, direction, loading: false })),
  );
  const res = await callRaw(workpaper.GET, "GET", {
    as: staff,
    params: { engagementId: String(engagement), sampleId: String(sampleId) },
  });
  expect(res.status).toBe(200);
  const file = path.join(os.tmpdir(), `printouts-${sampleId}.pdf`);
  fs.writeFileSync(file, Buffer.from(await res.arrayBuffer()));
  const pdf = squash(execFileSync("pdftotext", [file, "-"]).toString());
  return { api, page, pdf };
}

function expectSameFigures({ api, page, pdf }: Awaited<ReturnType<typeof printouts>>, extra: string[]) {
  const figures = amounts(api.block);
  expect(figures.length).toBeGreaterThan(5);
  for (const [where, value] of figures) {
    expect(page, `page prints ${where} = ${value}`).toContain(formatMoney(value));
    expect(pdf, `PDF prints ${where} = ${value}`).toContain(formatMoney(value));
  }
  for (const text of [...extra, api.computed.statement]) {
    expect(page).toContain(text);
    expect(pdf).toContain(text);
  }
}

describe("one evaluation, printed three times", () => {
  it("a monetary-unit sample tested both ways: the Stringer rows, limits and statement agree", async () => {
    const r = await planSample(senior, engagement, {
      populationId,
      direction: "both",
      params: { method: "mus", tolerableMisstatement: "15000", factorMode: "table" },
    });
    const id = r.json.sample.id as number;
    await drawSample(senior, engagement, id, 1206281);
    for (const it of await listSampleItems(staff, engagement, id)) {
      const audited = it.itemRef === "INV011" ? "3690.00" : it.itemRef === "INV018" ? "2887.50" : it.bookValue;
      expect(
        (
          await saveResult(staff, engagement, id, it.id, {
            version: it.version,
            status: "done",
            auditedValue: audited,
            cause: audited === it.bookValue ? null : "pricing",
          })
        ).status,
      ).toBe(200);
    }
    expect((await concludeSample(staff, engagement, id)).status).toBe(200);
    const out = await printouts(id, "both");
    const b = out.api.block!;
    if (b.method !== "mus") throw new Error("expected a monetary-unit block");
    const rows = [...b.overstatement.rows, ...b.understatement.rows];
    expect(rows.length).toBe(2);
    const factors = rows.flatMap((row) => [
      formatFactor(row.factor),
      formatFactor(row.factorIncrement),
      formatRate(row.tainting),
    ]);
    expectSameFigures(out, [...factors, formatFactor(b.overstatement.basicPrecisionFactor)]);
    expect(out.page).toContain(b.statement);
    expect(out.pdf).toContain(squash(b.statement));
    expect(out.pdf).toContain("Computed by Sondage");
  });

  it("a classical variables sample: Ŷ, SE, A, A′, A″ and the limits agree, with the rule in words", async () => {
    const r = await planSample(senior, engagement, {
      populationId,
      direction: "both",
      params: {
        method: "random",
        estimator: "difference",
        tolerableMisstatement: "30000",
        riskOfIncorrectRejection: 0.1,
      },
    });
    const id = r.json.sample.id as number;
    await drawSample(senior, engagement, id, 5489);
    for (const it of await listSampleItems(staff, engagement, id)) {
      const audited = it.itemRef === "INV004" ? "3425.75" : it.itemRef === "INV011" ? "3900.00" : it.bookValue;
      expect(
        (await saveResult(staff, engagement, id, it.id, { version: it.version, status: "done", auditedValue: audited }))
          .status,
      ).toBe(200);
    }
    const out = await printouts(id, "both");
    const b = out.api.block!;
    if (b.method !== "variables") throw new Error("expected a variables block");
    expectSameFigures(out, [formatFactor(b.decision.coefficient)]);
    expect(out.page).toContain(b.decision.rule);
    expect(out.pdf).toContain(squash(b.decision.rule));
  });

  it("a nonstatistical sample with key items: projection, key items at actual, total and the verdict agree (issue 15)", async () => {
    const r = await planSample(senior, engagement, {
      populationId,
      direction: "overstatement",
      params: {
        method: "nonstatistical",
        sizingBasis: "risk-assessment",
        assessedRisk: "maximum",
        otherProceduresRisk: "moderate",
        tolerableMisstatement: "5000",
        expectedMisstatement: "0",
        projection: "ratio",
        selection: "random",
        keyItemThreshold: "4000",
        keyItems: [{ itemRef: "INV004", reason: "Credit note raised after the period end" }],
      },
    });
    expect(r.status).toBe(201);
    const id = r.json.sample.id as number;
    await drawSample(senior, engagement, id, 5489);
    const items = await listSampleItems(staff, engagement, id);
    const sampled = items.find((i) => !(i as unknown as { keyItem: boolean }).keyItem)!;
    for (const it of items) {
      const audited =
        it.itemRef === "INV004"
          ? (Number(it.bookValue) - 75).toFixed(2)
          : it.id === sampled.id
            ? (Number(it.bookValue) - 40).toFixed(2)
            : it.bookValue;
      expect(
        (await saveResult(staff, engagement, id, it.id, { version: it.version, status: "done", auditedValue: audited }))
          .status,
      ).toBe(200);
    }
    const out = await printouts(id, "overstatement");
    const b = out.api.block!;
    if (b.method !== "nonstatistical") throw new Error("expected a nonstatistical block");
    expect(b.keyItems.misstatement).toBe("75.00");
    expectSameFigures(out, []);
    expect(out.page).toContain(b.statement);
    expect(out.pdf).toContain(squash(b.statement));
  });

  it("a classical sample with key items: the remainder's estimate and the key items at actual agree", async () => {
    const r = await planSample(senior, engagement, {
      populationId,
      direction: "overstatement",
      params: {
        method: "random",
        estimator: "difference",
        tolerableMisstatement: "6000",
        sampleSize: 8,
        sizeReason: "test",
        keyItemThreshold: "4000",
      },
    });
    expect(r.status).toBe(201);
    const id = r.json.sample.id as number;
    await drawSample(senior, engagement, id, 5489);
    for (const it of await listSampleItems(staff, engagement, id)) {
      const audited = it.itemRef === "INV011" ? "4000.00" : it.bookValue;
      expect(
        (await saveResult(staff, engagement, id, it.id, { version: it.version, status: "done", auditedValue: audited }))
          .status,
      ).toBe(200);
    }
    const out = await printouts(id, "overstatement");
    const b = out.api.block!;
    if (b.method !== "variables") throw new Error("expected a variables block");
    expect(b.atActual).not.toBeNull();
    expectSameFigures(out, [formatFactor(b.decision.coefficient)]);
  });

  it("a draft before the first result: the workpaper prints the plan and says why there is no evaluation yet", async () => {
    const r = await planSample(senior, engagement, {
      populationId,
      direction: "overstatement",
      params: { method: "mus", tolerableMisstatement: "15000" },
    });
    const id = r.json.sample.id as number;
    await drawSample(senior, engagement, id, 77);
    const api = (await getEvaluation(staff, engagement, id)) as SampleEvaluation;
    expect(api.block).toBeNull();
    const res = await callRaw(workpaper.GET, "GET", {
      as: staff,
      params: { engagementId: String(engagement), sampleId: String(id) },
    });
    expect(res.status).toBe(200);
    const file = path.join(os.tmpdir(), `printouts-draft-${id}.pdf`);
    fs.writeFileSync(file, Buffer.from(await res.arrayBuffer()));
    const pdf = squash(execFileSync("pdftotext", [file, "-"]).toString());
    expect(pdf).toContain("Not evaluated yet");
    expect(pdf).toContain(squash(api.computed.statement));
  });
});
