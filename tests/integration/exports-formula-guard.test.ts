// Every export a person can download as a spreadsheet — the fieldwork workbook (XLSX) and the
// problem list of an upload (CSV) — filled with text that a spreadsheet would run as a formula
// (OWASP "CSV Injection": cells starting with = + - @, tab or carriage return). No such cell may
// come out as a formula or as text that starts with a trigger.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import ExcelJS from "exceljs";
import Papa from "papaparse";
import { getDb } from "@/db/knex";
import { call, callRaw } from "./support/call";
import { makeEngagement, makeFirm, makeUser } from "./support/factory";
import { uploadAndLoad } from "./support/populations";
import { drawSample, listSampleItems, planSample, saveResult } from "./support/samples";
import * as reconcile from "@/app/api/engagements/[engagementId]/populations/[populationId]/reconciliation/route";
import * as workbook from "@/app/api/engagements/[engagementId]/samples/[sampleId]/workbook/route";
import * as problems from "@/app/api/engagements/[engagementId]/populations/uploads/[uploadId]/problems/route";
import * as summaryEntries from "@/app/api/engagements/[engagementId]/misstatements/entries/route";
import * as summaryWorkbook from "@/app/api/engagements/[engagementId]/misstatements/workbook/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

const TRIGGER = /^[=+\-@\t\r]/;
const HOSTILE = ["=cmd|' /C calc'!A0", "+SUM(1,2)", "-1+1", '@IMPORTXML("x")', "\t=1+1", "\r=1+1"];

let senior: number, staff: number, engagement: number;

beforeAll(async () => {
  const firm = await makeFirm();
  const manager = await makeUser(firm, "manager");
  [senior, staff] = await Promise.all([makeUser(firm, "senior"), makeUser(firm, "staff")]);
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
    [staff, "staff"],
  ]);
  const db = getDb();
  await db("engagements")
    .where({ id: engagement })
    .update({ client_name: '=HYPERLINK("http://x.example")', name: "+Audit FY2026" });
  await db("users").where({ id: staff }).update({ name: "@Staff Member" });
});

afterAll(async () => {
  await getDb().destroy();
});

function csvLine(cells: string[]) {
  return cells.map((c) => `"${c.replace(/"/g, '""')}"`).join(",");
}

describe("the fieldwork workbook", () => {
  it("writes every hostile text (references, descriptions, names, comments, cause notes) as inert text", async () => {
    const lines = [
      csvLine(["Invoice", "Customer", "Amount"]),
      ...HOSTILE.map((h, i) => csvLine([`${h}-${i}`, h, `${(i + 1) * 100}.00`])),
    ];
    const { loaded } = await uploadAndLoad(
      senior,
      engagement,
      "hostile.csv",
      lines.join("\n") + "\n",
      { itemRefColumn: "Invoice", bookValueColumn: "Amount", descriptionColumn: "Customer" },
      { name: "=Population name" },
    );
    const populationId = loaded!.last.populationId;
    await call(reconcile.POST, "POST", {
      as: senior,
      params: { engagementId: String(engagement), populationId: String(populationId) },
      body: { controlTotal: loaded!.last.total, controlCount: loaded!.last.rowCount },
    });
    const plan = await planSample(senior, engagement, {
      populationId,
      name: "-Sample name",
      params: {
        method: "random",
        estimator: "difference",
        tolerableMisstatement: "5000",
        sampleSize: HOSTILE.length,
        sizeReason: "every invoice",
      },
    });
    const sampleId = plan.json.sample.id as number;
    await drawSample(senior, engagement, sampleId, 5);
    const items = await listSampleItems(staff, engagement, sampleId);
    for (const [i, it] of items.entries()) {
      const saved = await saveResult(staff, engagement, sampleId, it.id, {
        version: it.version,
        status: "done",
        auditedValue: it.bookValue,
        cause: "other",
        causeNote: HOSTILE[i % HOSTILE.length],
        comment: HOSTILE[(i + 1) % HOSTILE.length],
      });
      expect(saved.status).toBe(200);
    }

    const res = await callRaw(workbook.GET, "GET", {
      as: staff,
      params: { engagementId: String(engagement), sampleId: String(sampleId) },
    });
    expect(res.status).toBe(200);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(await res.arrayBuffer());
    let textCells = 0,
      guarded = 0;
    for (const sheet of wb.worksheets) {
      sheet.eachRow((row, r) =>
        row.eachCell((cell, c) => {
          if (cell.type === ExcelJS.ValueType.Formula) {
            // Our own misstatement formula over the same row's cells (status, book, audited) is the only formula written.
            expect(cell.formula, `${sheet.name}!R${r}C${c}`).toBe(
              `IF(G${r}="Could not be audited",D${r},IF(F${r}="","",D${r}-F${r}))`,
            );
            return;
          }
          if (typeof cell.value !== "string") return;
          textCells++;
          expect(cell.value, `${sheet.name}!R${r}C${c}`).not.toMatch(TRIGGER);
          if (cell.value.startsWith("'") && TRIGGER.test(cell.value.slice(1))) guarded++;
        }),
      );
    }
    // 6 refs + 6 descriptions + 6 comments + 6 cause notes, and the cover's client and engagement names
    // (the population's and the exporter's names sit inside longer cover text, which starts with a letter).
    expect(guarded).toBeGreaterThanOrEqual(24 + 2);
    expect(textCells).toBeGreaterThan(guarded);
  });
});

describe("the summary of misstatements workbook", () => {
  it("writes hostile accounts, assertions and descriptions of the team's entries as inert text", async () => {
    for (const h of HOSTILE) {
      const r = await call(summaryEntries.POST, "POST", {
        as: staff,
        params: { engagementId: String(engagement) },
        body: {
          kind: "factual",
          account: `${h} account`,
          assertion: `${h} as`,
          description: `${h} description`,
          amount: "10.00",
          incomeEffect: "10.00",
          balanceEffect: "10.00",
        },
      });
      expect(r.status, JSON.stringify(r.json)).toBe(201);
    }
    const res = await callRaw(summaryWorkbook.GET, "GET", { as: staff, params: { engagementId: String(engagement) } });
    expect(res.status).toBe(200);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(await res.arrayBuffer());
    let guarded = 0;
    for (const sheet of wb.worksheets) {
      sheet.eachRow((row, r) =>
        row.eachCell((cell, c) => {
          expect(cell.type, `${sheet.name}!R${r}C${c}`).not.toBe(ExcelJS.ValueType.Formula);
          if (typeof cell.value !== "string") return;
          expect(cell.value, `${sheet.name}!R${r}C${c}`).not.toMatch(TRIGGER);
          if (cell.value.startsWith("'") && TRIGGER.test(cell.value.slice(1))) guarded++;
        }),
      );
    }
    expect(guarded).toBeGreaterThanOrEqual(HOSTILE.length * 3); // account, assertion, description of each entry
  });
});

describe("the problem list of an upload", () => {
  it("writes hostile references, values and column names as inert text", async () => {
    const header = csvLine(["Invoice", "=Amount"]);
    const rows = HOSTILE.map((h, i) => csvLine([`${h}-${i}`, h]));
    const { up, loaded } = await uploadAndLoad(senior, engagement, "bad.csv", [header, ...rows].join("\n") + "\n", {
      itemRefColumn: "Invoice",
      bookValueColumn: "=Amount",
    });
    expect(loaded?.last.type).toBe("rejected");
    const res = await callRaw(problems.GET, "GET", {
      as: senior,
      params: { engagementId: String(engagement), uploadId: String(up.json.upload.id) },
    });
    expect(res.status).toBe(200);
    const parsed = Papa.parse<string[]>((await res.text()).replace(/^\uFEFF/, ""), { skipEmptyLines: true });
    const fields = parsed.data.flat();
    expect(parsed.data.length).toBe(HOSTILE.length + 1);
    for (const field of fields) expect(field).not.toMatch(TRIGGER);
    expect(
      fields.filter(
        (f) =>
          f.startsWith("'=") ||
          f.startsWith("'+") ||
          f.startsWith("'-") ||
          f.startsWith("'@") ||
          f.startsWith("'\t") ||
          f.startsWith("'\r"),
      ).length,
    ).toBeGreaterThanOrEqual(HOSTILE.length);
  });
});
