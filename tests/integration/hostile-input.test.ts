// Hostile input to the endpoints that take files, JSON and search parameters: each gets a clear 4xx
// naming what was wrong, the next request still works, and nothing is stored.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { call } from "./support/call";
import { makeEngagement, makeFirm, makeUser } from "./support/factory";
import { populationState, upload } from "./support/populations";
import { drawSample, listSampleItems, loadCanonicalPopulation, planSample } from "./support/samples";
import { buildXlsx } from "./support/zip-builder";
import * as engagements from "@/app/api/engagements/route";
import * as populationItems from "@/app/api/engagements/[engagementId]/populations/[populationId]/items/route";
import * as sampleItems from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/route";
import * as saveItem from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/[itemId]/route";
import * as evidenceList from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/[itemId]/evidence/route";
import * as audit from "@/app/api/engagements/[engagementId]/samples/[sampleId]/audit/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let manager: number, senior: number, staff: number, engagement: number, populationId: number, sampleId: number;
let item: { id: number; version: number };

beforeAll(async () => {
  const firm = await makeFirm();
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
  ({ populationId } = await loadCanonicalPopulation(senior, engagement));
  const plan = await planSample(senior, engagement, {
    populationId,
    params: {
      method: "random",
      estimator: "difference",
      tolerableMisstatement: "5000",
      sampleSize: 6,
      sizeReason: "test",
    },
  });
  sampleId = plan.json.sample.id;
  await drawSample(senior, engagement, sampleId, 11);
  [item] = await listSampleItems(senior, engagement, sampleId);
});

afterAll(async () => {
  await getDb().destroy();
});

/** Rows that a refused request must not have added to. */
async function storedState() {
  const db = getDb();
  const count = async (table: string) => Number((await db(table).count({ n: "*" }).first())?.n);
  return {
    ...(await populationState()),
    uploads: await count("population_uploads"),
    evidence: await count("item_evidence"),
    engagements: await count("engagements"),
  };
}

const ep = () => ({ engagementId: String(engagement) });
const itemParams = () => ({ ...ep(), sampleId: String(sampleId), itemId: String(item.id) });

describe("uploaded file names", () => {
  const names = [
    "../../etc/passwd.csv",
    "..\\..\\boot.ini",
    "ledger\u0000.csv",
    "led\nger.csv",
    "ledger\u001b[31m.csv",
    "..",
  ];
  for (const fileName of names) {
    it(`refuses the ledger and evidence name ${JSON.stringify(fileName)} with 400 naming fileName`, async () => {
      const before = await storedState();
      const ledger = await upload(senior, engagement, fileName, "Invoice,Amount\nA-1,10.00\n");
      expect(ledger.status).toBe(400);
      expect(ledger.json.error.fields).toHaveProperty("fileName");
      const evidence = await call(evidenceList.POST, "POST", {
        as: staff,
        params: itemParams(),
        query: { fileName },
        file: new TextEncoder().encode("reply"),
      });
      expect(evidence.status).toBe(400);
      expect(evidence.json.error.fields).toHaveProperty("fileName");
      expect(await storedState()).toEqual(before);
    });
  }
});

describe("spoofed content types", () => {
  // Windows PE header ("MZ", Microsoft PE/COFF specification §2) sent as a PDF and as a CSV.
  const exe = new Uint8Array([
    0x4d, 0x5a, 0x90, 0x00, 0x03, 0x00, 0x00, 0x00, 0x04, 0x00, 0x00, 0x00, 0xff, 0xff, 0x00, 0x00,
  ]);
  it("judges the bytes, not the declared type or the extension", async () => {
    const before = await storedState();
    const evidence = await call(evidenceList.POST, "POST", {
      as: staff,
      params: itemParams(),
      query: { fileName: "statement.pdf" },
      file: exe,
      headers: { "content-type": "application/pdf" },
    });
    expect(evidence.status).toBeGreaterThanOrEqual(400);
    expect(evidence.status).toBeLessThan(500);
    expect(evidence.json.error.message).toMatch(/Accepted evidence/);
    const ledger = await call(
      (await import("@/app/api/engagements/[engagementId]/populations/uploads/route")).POST,
      "POST",
      {
        as: senior,
        params: ep(),
        query: { fileName: "ledger.csv" },
        file: exe,
        headers: { "content-type": "text/csv" },
      },
    );
    expect(ledger.status).toBe(422);
    expect(await storedState()).toEqual(before);
  });
});

describe("hostile workbooks and wide CSVs", () => {
  const header =
    '<row r="1"><c r="A1" t="inlineStr"><is><t>Invoice</t></is></c><c r="B1" t="inlineStr"><is><t>Amount</t></is></c></row>';
  const row = '<row r="2"><c r="A2" t="inlineStr"><is><t>INV-1</t></is></c><c r="B2"><v>10</v></c></row>';
  const sheet = (padding: Buffer) =>
    Buffer.concat([
      Buffer.from(
        `<?xml version="1.0" encoding="UTF-8"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>${header}${row}`,
      ),
      padding,
      Buffer.from("</sheetData></worksheet>"),
    ]);
  const padding = Buffer.alloc(200 * 1024 * 1024, 0x20); // 200 MB of spaces: deflates about 1000:1

  it("refuses a zip-bomb XLSX that declares its size (413, before inflating)", async () => {
    const before = await storedState();
    const bomb = buildXlsx(sheet(padding));
    expect(bomb.length).toBeLessThan(1024 * 1024);
    const r = await upload(senior, engagement, "bomb.xlsx", bomb);
    expect(r.status).toBe(413);
    expect(r.json.error.message).toMatch(/zip bomb/);
    expect(await storedState()).toEqual(before);
  });

  it("refuses a zip-bomb XLSX that lies about its size (413 at upload, after counting what it inflates to)", async () => {
    const before = await storedState();
    const started = performance.now();
    const r = await upload(senior, engagement, "liar.xlsx", buildXlsx(sheet(padding), { declaredSheetSize: 4096 }));
    expect(r.status).toBe(413);
    expect(r.json.error.message).toMatch(/zip bomb/);
    console.log(
      `zip bomb (${padding.length / 1024 / 1024} MB of XML, size lied about): refused in ${Math.round(performance.now() - started)} ms`,
    );
    expect(await storedState()).toEqual(before);
  });

  it("refuses a CSV with 10,000 columns (422 naming the limit)", async () => {
    const before = await storedState();
    const headers = Array.from({ length: 10_000 }, (_, i) => `C${i + 1}`).join(",");
    const values = Array.from({ length: 10_000 }, (_, i) => String(i)).join(",");
    const r = await upload(senior, engagement, "wide.csv", `${headers}\n${values}\n`);
    expect(r.status).toBe(422);
    expect(r.json.error.message).toMatch(/10,000 columns; a ledger may have at most 500/);
    expect(await storedState()).toEqual(before);
  });
});

describe("JSON bodies", () => {
  it("refuses oversized, deeply nested and wrongly typed bodies with a clear 4xx, and stores nothing", async () => {
    const before = await storedState();
    const big = await call(engagements.POST, "POST", {
      as: manager,
      rawBody: JSON.stringify({ clientName: "x".repeat(300 * 1024) }),
    });
    expect(big.status).toBe(413);
    const deep = await call(engagements.POST, "POST", {
      as: manager,
      rawBody: "[".repeat(100_000) + "]".repeat(100_000),
    });
    expect(deep).toMatchObject({ status: 400, json: { error: { code: "too_deep" } } });
    const typed = await call(engagements.POST, "POST", {
      as: manager,
      body: {
        clientName: 7,
        name: ["x"],
        periodEnd: "2026-13-45",
        currency: 1,
        overallMateriality: "1e9",
        performanceMateriality: {},
      },
    });
    expect(typed.status).toBe(400);
    expect(Object.keys(typed.json.error.fields).sort()).toEqual([
      "clientName",
      "currency",
      "name",
      "overallMateriality",
      "performanceMateriality",
      "periodEnd",
    ]);
    const save = await call(saveItem.PATCH, "PATCH", {
      as: staff,
      params: itemParams(),
      body: { version: "one", status: "done", auditedValue: "12.345' OR '1'='1" },
    });
    expect(save.status).toBe(400);
    expect(save.json.error.fields).toHaveProperty("version");
    expect(await storedState()).toEqual(before);
    const fine = await call(engagements.GET, "GET", { as: manager });
    expect(fine.status, "the server still answers").toBe(200);
  });
});

describe("SQL metacharacters in sort, filter and search parameters", () => {
  const injections = [
    "' OR '1'='1",
    "1; DROP TABLE users; --",
    "%",
    "_",
    "\\",
    "row` DESC, (SELECT SLEEP(5))",
    "\u0000",
  ];
  it("population items: sort and direction are whitelisted (400), search is a literal (200, nothing found)", async () => {
    for (const bad of injections) {
      const sorted = await call(populationItems.GET, "GET", {
        as: staff,
        params: { ...ep(), populationId: String(populationId) },
        query: { sort: bad },
      });
      expect(sorted.status, `sort=${bad}`).toBe(400);
      const dir = await call(populationItems.GET, "GET", {
        as: staff,
        params: { ...ep(), populationId: String(populationId) },
        query: { dir: bad },
      });
      expect(dir.status, `dir=${bad}`).toBe(400);
      const searched = await call(populationItems.GET, "GET", {
        as: staff,
        params: { ...ep(), populationId: String(populationId) },
        query: { q: bad },
      });
      expect(searched.status, `q=${bad}`).toBe(200);
      expect(searched.json.items, `q=${bad} matches nothing literally`).toEqual([]);
    }
  });

  it("sample items and the audit trail: filters are whitelisted, search is a literal", async () => {
    for (const bad of injections) {
      const status = await call(sampleItems.GET, "GET", {
        as: staff,
        params: { ...ep(), sampleId: String(sampleId) },
        query: { status: bad },
      });
      expect(status.status, `status=${bad}`).toBe(400);
      const q = await call(sampleItems.GET, "GET", {
        as: staff,
        params: { ...ep(), sampleId: String(sampleId) },
        query: { q: bad },
      });
      expect(q.status, `q=${bad}`).toBe(200);
      expect(q.json.items).toEqual([]);
      const kind = await call(audit.GET, "GET", {
        as: staff,
        params: { ...ep(), sampleId: String(sampleId) },
        query: { kind: bad },
      });
      expect(kind.status, `kind=${bad}`).toBe(400);
      const user = await call(audit.GET, "GET", {
        as: staff,
        params: { ...ep(), sampleId: String(sampleId) },
        query: { userId: bad },
      });
      expect(user.status, `userId=${bad}`).toBe(400);
    }
    const users = await getDb()("users").count({ n: "*" }).first();
    expect(Number(users?.n)).toBeGreaterThan(0);
  });
});
