import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import ExcelJS from "exceljs";
import { getDb } from "@/db/knex";
import { call, callRaw } from "./support/call";
import { auditCount, makeEngagement, makeFirm, makeUser } from "./support/factory";
import { uploadAndLoad, RECEIVABLES_MAPPING } from "./support/populations";
import { drawSample, getEvaluation, listSampleItems, planSample, saveResult } from "./support/samples";
import * as reconcile from "@/app/api/engagements/[engagementId]/populations/[populationId]/reconciliation/route";
import * as workbook from "@/app/api/engagements/[engagementId]/samples/[sampleId]/workbook/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let senior: number, staff: number, viewer: number, outsider: number, engagement: number;

// Descriptions that a spreadsheet would run as formulas if written as such (OWASP "CSV Injection").
const LEDGER = [
  "Invoice,Customer,Amount",
  'INV-01,"=HYPERLINK(""http://x.example"",""click"")",1250.00',
  "INV-02,+SUM(A1:A9),480.50",
  "INV-03,-2+3,3625.75",
  "INV-04,@cmd,910.20",
  "INV-05,Alder & Pike,12500.00",
  "INV-06,Birchwood Co,155.00",
  "INV-07,Cedar Row,2300.10",
  "INV-08,Dunmore Traders,777.77",
  "",
].join("\n");

beforeAll(async () => {
  const firm = await makeFirm();
  [senior, staff, viewer, outsider] = await Promise.all([
    makeUser(firm, "senior"),
    makeUser(firm, "staff"),
    makeUser(firm, "staff"),
    makeUser(firm, "senior"),
  ]);
  const manager = await makeUser(firm, "manager");
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
    [staff, "staff"],
    [viewer, "viewer"],
  ]);
  await makeEngagement(firm, manager, [
    [manager, "manager"],
    [outsider, "senior"],
  ]);
});

afterAll(async () => {
  await getDb().destroy();
});

async function drawnSample(method: "random" | "attribute") {
  const { loaded } = await uploadAndLoad(senior, engagement, "ledger.csv", LEDGER, RECEIVABLES_MAPPING);
  const populationId = loaded!.last.populationId;
  await call(reconcile.POST, "POST", {
    as: senior,
    params: { engagementId: String(engagement), populationId: String(populationId) },
    body: { controlTotal: loaded!.last.total, controlCount: loaded!.last.rowCount },
  });
  const params =
    method === "random"
      ? { method, estimator: "difference", tolerableMisstatement: "5000", sampleSize: 8, sizeReason: "every invoice" }
      : { method, tolerableRate: 0.1, sampleSize: 8, sizeReason: "every invoice" };
  const plan = await planSample(senior, engagement, { populationId, params });
  expect(plan.status).toBe(201);
  const sampleId = plan.json.sample.id as number;
  expect((await drawSample(senior, engagement, sampleId, 20261231)).status).toBe(201);
  return sampleId;
}

const params = (sampleId: number) => ({ engagementId: String(engagement), sampleId: String(sampleId) });

async function exportWorkbook(sampleId: number, as = staff) {
  const res = await callRaw(workbook.GET, "GET", { as, params: params(sampleId) });
  expect(res.status).toBe(200);
  expect(res.headers.get("content-type")).toContain("spreadsheetml");
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(await res.arrayBuffer());
  return wb;
}

function columnsOf(ws: ExcelJS.Worksheet) {
  const cols: Record<string, number> = {};
  ws.getRow(1).eachCell((cell, col) => {
    cols[cell.text] = col;
  });
  return cols;
}

function rowOf(ws: ExcelJS.Worksheet, ref: string) {
  const col = columnsOf(ws)["Item reference"];
  for (let r = 2; r <= ws.rowCount; r++) if (ws.getRow(r).getCell(col).value === ref) return ws.getRow(r);
  throw new Error(`no row ${ref}`);
}

async function importWorkbook(sampleId: number, wb: ExcelJS.Workbook, as = staff) {
  const file = new Uint8Array(await wb.xlsx.writeBuffer());
  return call(workbook.POST, "POST", { as, params: params(sampleId), file, query: { fileName: "filled.xlsx" } });
}

const itemsState = async (sampleId: number) =>
  await getDb()("sample_items")
    .where({ sample_id: sampleId })
    .orderBy("id")
    .select("id", "status", "audited_value", "comment", "version");

describe("the fieldwork workbook export", () => {
  it("has a cover sheet, an Items sheet people may sort and filter with only the fill-in columns unlocked, lists, and no formula but the misstatement", async () => {
    const sampleId = await drawnSample("random");
    const wb = await exportWorkbook(sampleId);
    const cover = wb.getWorksheet("Cover")!;
    const coverText = cover.getSheetValues().flat().map(String).join("\n");
    const draw = (await getDb()("sample_draws").where({ sample_id: sampleId, current: true }).first())!;
    expect(coverText).toContain(draw.population_sha256);
    expect(coverText).toContain("20261231");
    expect(coverText).toContain("Simple random");
    expect(coverText).toMatch(/do not replace, the auditor's professional judgement/);

    const ws = wb.getWorksheet("Items")!;
    const cols = columnsOf(ws);
    expect(Object.keys(cols)).toEqual([
      "Order",
      "Item reference",
      "Description",
      "Book value",
      "Selected as",
      "Audited value",
      "Status",
      "Cause",
      "Cause detail",
      "Comment",
      "Misstatement (book − audited)",
      "Item id",
      "Version",
      "Exported values",
    ]);
    expect(ws.rowCount).toBe(9);
    // Issue 19: unprotected (Excel will not sort a protected range holding locked cells), with filters on the header row.
    expect((ws as unknown as { sheetProtection?: { sheet?: boolean } }).sheetProtection?.sheet ?? false).toBe(false); // not in the typings
    expect(ws.autoFilter).toBeTruthy();
    for (const hidden of ["Item id", "Version", "Exported values"])
      expect(ws.getColumn(cols[hidden]).hidden).toBe(true);
    const fill = new Set(["Audited value", "Status", "Cause", "Cause detail", "Comment"]);
    const row = ws.getRow(2);
    for (const [header, col] of Object.entries(cols))
      expect(row.getCell(col).protection?.locked === false).toBe(fill.has(header));
    expect(row.getCell(cols.Status).dataValidation).toMatchObject({
      type: "list",
      formulae: ['"Not started,Done,Could not be audited"'],
    });
    expect(row.getCell(cols.Cause).dataValidation?.type).toBe("list");

    // No cell anywhere runs a formula except the misstatement column (OWASP "CSV Injection").
    for (const sheet of wb.worksheets) {
      sheet.eachRow((r) =>
        r.eachCell((cell, col) => {
          if (cell.type === ExcelJS.ValueType.Formula)
            expect([sheet.name, col]).toEqual(["Items", cols["Misstatement (book − audited)"]]);
        }),
      );
    }
    expect(row.getCell(cols["Misstatement (book − audited)"]).formula).toMatch(/D2-F2/);
    // Issue 15: how each item came into the sample; a random draw without key items holds only "Sample" rows.
    for (let r = 2; r <= ws.rowCount; r++) expect(ws.getRow(r).getCell(cols["Selected as"]).value).toBe("Sample");
    // Formula-looking descriptions are text with the apostrophe prefix.
    expect(rowOf(ws, "INV-01").getCell(cols.Description).value).toBe('\'=HYPERLINK("http://x.example","click")');
    expect(rowOf(ws, "INV-02").getCell(cols.Description).value).toBe("'+SUM(A1:A9)");
    expect(rowOf(ws, "INV-03").getCell(cols.Description).value).toBe("'-2+3");
    expect(rowOf(ws, "INV-04").getCell(cols.Description).value).toBe("'@cmd");
    expect(rowOf(ws, "INV-05").getCell(cols.Description).value).toBe("Alder & Pike");
    expect(rowOf(ws, "INV-05").getCell(cols["Book value"]).value).toBe(12500);
  });

  it("is open to viewers, 404 to someone off the engagement, 409 before the draw", async () => {
    const sampleId = await drawnSample("random");
    expect((await callRaw(workbook.GET, "GET", { as: viewer, params: params(sampleId) })).status).toBe(200);
    expect((await callRaw(workbook.GET, "GET", { as: outsider, params: params(sampleId) })).status).toBe(404);
    const sample = (await getDb()("samples").where({ id: sampleId }).first())!;
    const planned = await planSample(senior, engagement, {
      populationId: sample.population_id,
      params: { method: "random", estimator: "difference", tolerableMisstatement: "5000" },
    });
    const undrawn = await call(workbook.GET, "GET", { as: staff, params: params(planned.json.sample.id) });
    expect(undrawn.status).toBe(409);
    expect(undrawn.json.error.message).toMatch(/not been drawn/);
  });
});

describe("the fieldwork workbook import", () => {
  it('still reads a workbook exported before the read-only "Selected as" column existed', async () => {
    const sampleId = await drawnSample("random");
    const wb = await exportWorkbook(sampleId);
    const ws = wb.getWorksheet("Items")!;
    ws.spliceColumns(columnsOf(ws)["Selected as"], 1);
    const cols = columnsOf(ws);
    expect(cols).not.toHaveProperty("Selected as");
    const r = rowOf(ws, "INV-08");
    r.getCell(cols["Audited value"]).value = 777.77;
    r.getCell(cols.Status).value = "Done";
    const res = await importWorkbook(sampleId, wb);
    expect(res.status).toBe(200);
    expect(res.json).toMatchObject({ rows: 8, changed: 1, unchanged: 7 });
  });

  it("round-trips: filled values are saved with audit rows and version + 1, and the evaluation changes", async () => {
    const sampleId = await drawnSample("random");
    const before = await getEvaluation(staff, engagement, sampleId);
    expect(before.progress.done).toBe(0);
    const wb = await exportWorkbook(sampleId);
    const ws = wb.getWorksheet("Items")!;
    const cols = columnsOf(ws);
    const fillRow = (ref: string, values: Record<string, ExcelJS.CellValue>) => {
      const r = rowOf(ws, ref);
      for (const [h, v] of Object.entries(values)) r.getCell(cols[h]).value = v;
    };
    fillRow("INV-01", { "Audited value": 1250, Status: "Done" });
    fillRow("INV-05", {
      "Audited value": 12000,
      Status: "Done",
      Cause: "Pricing or rate",
      Comment: "=1+2 seen on the invoice",
    });
    fillRow("INV-06", { "Audited value": "155.00" }); // status left "Not started" → refused below, then fixed
    let res = await importWorkbook(sampleId, wb);
    expect(res.status).toBe(422);
    expect(res.json.error.problems).toEqual([
      expect.objectContaining({ row: rowOf(ws, "INV-06").number, column: "Status" }),
    ]);
    expect((await itemsState(sampleId)).every((i) => i.status === "not-started" && i.version === 1)).toBe(true);

    fillRow("INV-06", { Status: "Done" });
    fillRow("INV-07", { Status: "Not auditable", Comment: "Customer could not be traced" }); // the earlier label is still read
    const auditsBefore = await auditCount({ action: "record-result" });
    res = await importWorkbook(sampleId, wb);
    expect(res.status).toBe(200);
    expect(res.json).toMatchObject({ rows: 8, changed: 4, unchanged: 4 });
    expect(await auditCount({ action: "record-result" })).toBe(auditsBefore + 4);
    expect(await auditCount({ entity: "sample", entity_id: String(sampleId), action: "import-workbook" })).toBe(1);

    const items = await listSampleItems(staff, engagement, sampleId);
    const byRef = Object.fromEntries(items.map((i) => [i.itemRef, i])) as Record<
      string,
      (typeof items)[number] & {
        auditedValue: string | null;
        misstatement: string | null;
        comment: string | null;
        cause: string | null;
      }
    >;
    expect(byRef["INV-05"]).toMatchObject({
      status: "done",
      auditedValue: "12000.00",
      misstatement: "500.00",
      cause: "pricing",
      version: 2,
      comment: "=1+2 seen on the invoice",
    });
    expect(byRef["INV-07"]).toMatchObject({ status: "not-auditable", misstatement: "2300.10", version: 2 });
    expect(byRef["INV-02"]).toMatchObject({ status: "not-started", version: 1 });

    const after = await getEvaluation(staff, engagement, sampleId);
    expect(after.progress).toMatchObject({
      done: 3,
      notAuditable: 1,
      notStarted: 4,
      misstatements: 2,
      misstatementTotal: "2800.10",
    });

    // The same workbook imported again changes nothing: every row still matches what it exported or what is saved.
    res = await importWorkbook(sampleId, wb);
    expect(res.json).toMatchObject({ changed: 0, unchanged: 8 });
  });

  it("imports a workbook whose rows were sorted (issue 19: rows are matched by id, not order)", async () => {
    const sampleId = await drawnSample("random");
    const wb = await exportWorkbook(sampleId);
    const ws = wb.getWorksheet("Items")!;
    const cols = columnsOf(ws);
    const width = Object.keys(cols).length;
    const data = Array.from({ length: ws.rowCount - 1 }, (_, i) =>
      Array.from({ length: width }, (_c, c) => ws.getRow(i + 2).getCell(c + 1).value),
    );
    const refsBefore = data.map((values) => values[cols["Item reference"] - 1]);
    data.reverse().forEach((values, i) =>
      values.forEach((v, c) => {
        ws.getRow(i + 2).getCell(c + 1).value = v;
      }),
    );
    const refsAfter = data.map((_v, i) => ws.getRow(i + 2).getCell(cols["Item reference"]).value);
    expect(refsAfter).toEqual(refsBefore.slice().reverse());
    rowOf(ws, "INV-02").getCell(cols["Audited value"]).value = 800;
    rowOf(ws, "INV-02").getCell(cols.Status).value = "Done";
    const res = await importWorkbook(sampleId, wb);
    expect(res.status, JSON.stringify(res.json)).toBe(200);
    expect(res.json).toMatchObject({ rows: 8, changed: 1, unchanged: 7 });
    const items = await listSampleItems(staff, engagement, sampleId);
    expect(items.find((i) => i.itemRef === "INV-02")).toMatchObject({ status: "done", auditedValue: "800.00" });
  });

  it("refuses a sheet with a wrong reference, text in an amount cell and a formula in a cell, applying nothing", async () => {
    const sampleId = await drawnSample("random");
    const wb = await exportWorkbook(sampleId);
    const ws = wb.getWorksheet("Items")!;
    const cols = columnsOf(ws);
    rowOf(ws, "INV-01").getCell(cols["Audited value"]).value = 1200; // valid on its own
    rowOf(ws, "INV-01").getCell(cols.Status).value = "Done";
    const wrong = rowOf(ws, "INV-02");
    wrong.getCell(cols["Item reference"]).value = "INV-99";
    const text = rowOf(ws, "INV-03");
    text.getCell(cols["Audited value"]).value = "about three thousand";
    text.getCell(cols.Status).value = "Done";
    const formula = rowOf(ws, "INV-04");
    formula.getCell(cols["Audited value"]).value = { formula: "D5*0.9" };
    formula.getCell(cols.Comment).value = '=HYPERLINK("http://evil.example")'; // text that looks like a formula: kept as text, no problem
    const status = rowOf(ws, "INV-05");
    status.getCell(cols.Status).value = "Finished";
    const before = await itemsState(sampleId);
    const res = await importWorkbook(sampleId, wb);
    expect(res.status).toBe(422);
    expect(res.json.error.message).toMatch(/Nothing was changed/);
    const problems = res.json.error.problems as { row: number; column: string; cell: string; reason: string }[];
    const letter = (h: string) => ws.getColumn(cols[h]).letter;
    expect([...problems].sort((a, b) => a.row - b.row)).toEqual(
      [
        {
          row: wrong.number,
          column: "Item reference",
          cell: `${letter("Item reference")}${wrong.number}`,
          reason: expect.stringMatching(/Unknown reference.*INV-99/),
        },
        {
          row: text.number,
          column: "Audited value",
          cell: `${letter("Audited value")}${text.number}`,
          reason: expect.stringMatching(/Text in an amount cell: "about three thousand"/),
        },
        {
          row: formula.number,
          column: "Audited value",
          cell: `${letter("Audited value")}${formula.number}`,
          reason: expect.stringMatching(/formula/),
        },
        {
          row: status.number,
          column: "Status",
          cell: `${letter("Status")}${status.number}`,
          reason: expect.stringMatching(/"Finished" is not in the list/),
        },
      ].sort((a, b) => a.row - b.row),
    );
    expect(await itemsState(sampleId)).toEqual(before);
  });

  it("refuses a row whose item changed since the export, naming who changed it; untouched stale rows are no conflict", async () => {
    const sampleId = await drawnSample("random");
    const wb = await exportWorkbook(sampleId);
    const items = await listSampleItems(staff, engagement, sampleId);
    const [first, second] = [items.find((i) => i.itemRef === "INV-01")!, items.find((i) => i.itemRef === "INV-02")!];
    expect(
      (
        await saveResult(senior, engagement, sampleId, first.id, {
          version: first.version,
          status: "done",
          auditedValue: "1250.00",
        })
      ).status,
    ).toBe(200);
    expect(
      (
        await saveResult(senior, engagement, sampleId, second.id, {
          version: second.version,
          status: "done",
          auditedValue: "480.50",
        })
      ).status,
    ).toBe(200);
    const ws = wb.getWorksheet("Items")!;
    const cols = columnsOf(ws);
    const stale = rowOf(ws, "INV-01");
    stale.getCell(cols["Audited value"]).value = 1000;
    stale.getCell(cols.Status).value = "Done";
    rowOf(ws, "INV-03").getCell(cols["Audited value"]).value = 3625.75;
    rowOf(ws, "INV-03").getCell(cols.Status).value = "Done";
    const res = await importWorkbook(sampleId, wb);
    expect(res.status).toBe(422);
    const seniorName = (await getDb()("users").where({ id: senior }).first())!.name;
    expect(res.json.error.problems).toEqual([
      {
        row: stale.number,
        column: "Item reference",
        cell: expect.any(String),
        reason: expect.stringContaining(`Version conflict: ${seniorName} changed this item`),
      },
    ]);
    const saved = (await getDb()("sample_items").where({ id: first.id }).first())!;
    expect([saved.audited_value, saved.version]).toEqual(["1250.00", 2]);
    expect((await getDb()("sample_items").where({ sample_id: sampleId, item_ref: "INV-03" }).first())!.status).toBe(
      "not-started",
    );
  });

  it("checks the file by content and size, and needs staff", async () => {
    const sampleId = await drawnSample("random");
    const wb = await exportWorkbook(sampleId);
    expect((await importWorkbook(sampleId, wb, viewer)).status).toBe(403);
    expect((await importWorkbook(sampleId, wb, outsider)).status).toBe(404);
    await getDb()("samples")
      .where({ id: sampleId })
      .update({ locked_at: getDb().fn.now(3) }); // the lock itself is tested with the review routes
    const locked = await importWorkbook(sampleId, wb);
    await getDb()("samples").where({ id: sampleId }).update({ locked_at: null });
    expect([locked.status, locked.json.error.code]).toEqual([409, "locked"]);
    const csv = await call(workbook.POST, "POST", {
      as: staff,
      params: params(sampleId),
      file: new TextEncoder().encode("Item reference,Audited value\nINV-01,5\n"),
      query: { fileName: "filled.xlsx" },
    });
    expect(csv.status).toBe(415);
    expect(csv.json.error.message).toMatch(/not an Excel workbook/);
    const big = await call(workbook.POST, "POST", {
      as: staff,
      params: params(sampleId),
      file: new Uint8Array(20 * 1024 * 1024 + 1),
    });
    expect(big.status).toBe(413);
    expect(big.json.error.message).toMatch(/20 MB limit/);
  });

  it("round-trips an attribute sample through its deviation columns", async () => {
    const sampleId = await drawnSample("attribute");
    const wb = await exportWorkbook(sampleId);
    const ws = wb.getWorksheet("Items")!;
    const cols = columnsOf(ws);
    expect(Object.keys(cols)).toEqual([
      "Order",
      "Item reference",
      "Description",
      "Book value",
      "Selected as",
      "Status",
      "Deviation (yes/no)",
      "Nature of deviation",
      "Comment",
      "Item id",
      "Version",
      "Exported values",
    ]);
    for (let r = 2; r <= ws.rowCount; r++) {
      ws.getRow(r).getCell(cols["Deviation (yes/no)"]).value = r === 3 ? "Yes" : "No";
      ws.getRow(r).getCell(cols.Status).value = "Done";
    }
    ws.getRow(3).getCell(cols["Nature of deviation"]).value = "Approval signature missing";
    const res = await importWorkbook(sampleId, wb);
    expect(res.status).toBe(200);
    expect(res.json.changed).toBe(8);
    const evaluation = await getEvaluation(staff, engagement, sampleId);
    expect(evaluation.block).toMatchObject({ method: "attributes", sampleSize: 8, deviations: 1 });
    const nature = (await getDb()("sample_items").where({ sample_id: sampleId, deviation: true }).first())!;
    expect(nature.deviation_nature).toBe("Approval signature missing");
  });
});
