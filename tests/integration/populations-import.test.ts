import { createHash } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import ExcelJS from "exceljs";
import iconv from "iconv-lite";
import { getDb } from "@/db/knex";
import { call, callRaw } from "./support/call";
import { auditCount, makeEngagement, makeFirm, makeUser } from "./support/factory";
import { populationState, RECEIVABLES_MAPPING, upload, uploadAndLoad } from "./support/populations";
import { claimUploadForLoading } from "@/lib/data/population-uploads";
import { timeoutScale } from "./test-env";
import { ListObjectsV2Command } from "@aws-sdk/client-s3";
import { getStorage } from "@/lib/storage/s3-client";
import { uploadObjectKey } from "@/lib/populations/upload-files";
import * as population from "@/app/api/engagements/[engagementId]/populations/[populationId]/route";
import * as original from "@/app/api/engagements/[engagementId]/populations/[populationId]/original/route";
import * as problemsCsv from "@/app/api/engagements/[engagementId]/populations/uploads/[uploadId]/problems/route";
import * as inspect from "@/app/api/engagements/[engagementId]/populations/uploads/[uploadId]/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let senior: number, staff: number, outsider: number, engagement: number, other: number;

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
  other = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [outsider, "senior"],
  ]);
});

afterAll(async () => {
  await getDb().destroy();
});

const GOOD_CSV = [
  "Invoice,Customer,Amount,Due",
  'INV-1001,"Alder & Pike, Ltd",1250.00,2026-10-15',
  'INV-1002,"Birchwood ""North"" Co",480.50,2026-10-20',
  'INV-1003,"Cedar Row\nWarehouse 2",0.00,2026-10-22',
  "INV-1004,Dunmore Traders,(420.00),2026-10-25",
  'INV-1005,=HYPERLINK("http://x.example"),3625.75,2026-11-01',
  "",
].join("\r\n");

describe("a good CSV", () => {
  it("loads atomically with exact totals, the SHA-256 as received, the original in storage and an audit row", async () => {
    const { up, loaded } = await uploadAndLoad(senior, engagement, "receivables.csv", GOOD_CSV);
    expect(up.status).toBe(201);
    expect(up.json.upload.sha256).toBe(createHash("sha256").update(GOOD_CSV).digest("hex"));
    expect(up.json.upload.inspection.headers).toEqual(["Invoice", "Customer", "Amount", "Due"]);
    expect(loaded?.last).toMatchObject({ type: "loaded", rowCount: 5, total: "4936.25" });
    const id = loaded!.last.populationId;
    const p = (
      await call(population.GET, "GET", {
        as: staff,
        params: { engagementId: String(engagement), populationId: String(id) },
      })
    ).json.population;
    expect(p).toMatchObject({
      rowCount: 5,
      total: "4936.25",
      status: "unreconciled",
      sourceFileName: "receivables.csv",
      positive: { count: 3, total: "5356.25" },
      zero: { count: 1 },
      negative: { count: 1, total: "-420.00" },
    });
    const items = await getDb()("population_items").where({ population_id: id }).orderBy("row_number");
    // RFC 4180 §2: quoted fields keep commas, doubled quotes and line breaks.
    expect(items.map((i) => i.description)).toEqual([
      "Alder & Pike, Ltd",
      'Birchwood "North" Co',
      "Cedar Row\nWarehouse 2",
      "Dunmore Traders",
      '=HYPERLINK("http://x.example")',
    ]);
    // Row numbers are the records a spreadsheet shows (a quoted line break stays inside its row).
    expect(items.map((i) => i.row_number)).toEqual([2, 3, 4, 5, 6]);
    expect(await auditCount({ entity: "population", entity_id: String(id), action: "load" })).toBe(1);

    const res = await callRaw(original.GET, "GET", {
      as: staff,
      params: { engagementId: String(engagement), populationId: String(id) },
    });
    const stored = Buffer.from(await res.arrayBuffer());
    expect(createHash("sha256").update(stored).digest("hex")).toBe(up.json.upload.sha256);
  });

  it("reads Windows-1252 text and European number formats", async () => {
    const text = "Référence;Montant;Client\nF-1;1.234,56 €;Société Générale\nF-2;-12,30;Café Noël\n";
    const bytes = iconv.encode(text, "win1252");
    const { up, loaded } = await uploadAndLoad(senior, engagement, "grand-livre.csv", bytes, {
      itemRefColumn: "Référence",
      bookValueColumn: "Montant",
      descriptionColumn: "Client",
    });
    expect(up.json.upload.inspection).toMatchObject({
      encoding: "windows-1252",
      delimiter: ";",
      detectedNumberFormat: "comma-decimal",
    });
    expect(loaded?.last).toMatchObject({ type: "loaded", rowCount: 2, total: "1222.26" });
    const items = await getDb()("population_items")
      .where({ population_id: loaded!.last.populationId })
      .orderBy("row_number");
    expect(items.map((i) => [i.item_ref, i.book_value, i.description])).toEqual([
      ["F-1", "1234.56", "Société Générale"],
      ["F-2", "-12.30", "Café Noël"],
    ]);
  });
});

describe("whole-file refusals leave the database as it was", () => {
  const cases: [string, string | Uint8Array, number, RegExp][] = [
    ["an empty file", "", 422, /empty/i],
    ["a header only", "Invoice,Amount\n", 422, /no data rows/i],
    ["no header row", "INV-1,100.00\nINV-2,200.00\n", 422, /header/i],
    [
      "a binary file renamed .csv",
      new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 1, 0]),
      422,
      /not text/i,
    ],
    [
      "UTF-16 text",
      new Uint8Array([0xff, 0xfe, 0x49, 0x00, 0x6e, 0x00, 0x2c, 0x00, 0x41, 0x00, 0x0a, 0x00]),
      422,
      /encoding|UTF-16/i,
    ],
    ["a duplicated header name", "Invoice,Amount,Amount\nINV-1,1.00,2.00\n", 422, /Amount/],
  ];
  for (const [what, bytes, status, message] of cases) {
    it(`refuses ${what} (${status})`, async () => {
      const before = await populationState();
      const r = await upload(senior, engagement, "ledger.csv", bytes);
      expect(r.status).toBe(status);
      expect(r.json.error.message).toMatch(message);
      expect(await populationState()).toEqual(before);
    });
  }

  it("refuses a file over the size limit before reading it, naming the limit", async () => {
    const r = await call(
      (await import("@/app/api/engagements/[engagementId]/populations/uploads/route")).POST,
      "POST",
      {
        as: senior,
        params: { engagementId: String(engagement) },
        query: { fileName: "huge.csv" },
        file: new TextEncoder().encode("Invoice,Amount\n"),
        headers: { "content-length": String(201 * 1024 * 1024) },
      },
    );
    expect(r.status).toBe(413);
    expect(r.json.error.message).toMatch(/200 MB/);
  });

  it(
    "refuses a file over 1,000,000 data rows at upload, naming the limit and the row, and stores nothing",
    async () => {
      const rows = ["Invoice,Amount"];
      for (let i = 1; i <= 1_000_001; i++) rows.push(`R${i},1`);
      const before = await populationState();
      const uploadsBefore = await getDb()("population_uploads").count({ n: "*" }).first();
      const storedBefore = await storedUploadKeys(engagement);
      const up = await upload(senior, engagement, "too-many.csv", rows.join("\n"));
      expect(up.status).toBe(413);
      // The header is row 1, so data row 1,000,001 is the file's row 1,000,002.
      expect(up.json.error.message).toMatch(
        /Row 1,000,002 is data row 1,000,001: a population holds at most 1,000,000 data rows/,
      );
      expect(await populationState()).toEqual(before);
      expect(await getDb()("population_uploads").count({ n: "*" }).first()).toEqual(uploadsBefore);
      // The bytes were stored while the rows were counted: the refusal removes them again.
      expect(await storedUploadKeys(engagement)).toEqual(storedBefore);
    },
    60_000 * timeoutScale,
  );
});

describe("row problems store nothing and are listed with row, column and reason", () => {
  it("reports each bad row and keeps the full list downloadable", async () => {
    const csv = [
      "Invoice,Customer,Amount",
      "INV-1,Alder,100.00",
      ",Birch,200.00",
      "INV-3,Cedar,twelve",
      "INV-4,Dunmore,1.005",
      "INV-5,Elm",
      "INV-6,Fir,60.00",
    ].join("\n");
    const before = await populationState();
    const { up, loaded } = await uploadAndLoad(senior, engagement, "bad.csv", csv);
    expect(loaded?.last.type).toBe("rejected");
    const problems = loaded!.last.problems as { row: number; column: string | null; reason: string }[];
    expect(problems.map((p) => [p.row, p.column])).toEqual([
      [3, "Invoice"],
      [4, "Amount"],
      [5, "Amount"],
      [6, null],
    ]);
    expect(problems[1].reason).toMatch(/"twelve"/);
    expect(problems[3].reason).toMatch(/2 fields; the header row has 3/);
    expect(await populationState()).toEqual(before);
    const res = await callRaw(problemsCsv.GET, "GET", {
      as: senior,
      params: { engagementId: String(engagement), uploadId: String(up.json.upload.id) },
    });
    const text = await res.text();
    expect(res.headers.get("content-disposition")).toMatch(/bad-problems\.csv/);
    expect(text.split(/\r?\n/)[0]).toBe("Row,Column,Problem");
    expect(text).toContain("4,Amount,");
  });
});

describe("XLSX", () => {
  async function workbook(): Promise<Uint8Array> {
    const wb = new ExcelJS.Workbook();
    const notes = wb.addWorksheet("Notes");
    notes.addRow(["Prepared by the client"]);
    const ws = wb.addWorksheet("Receivables");
    ws.addRow(["Invoice", "Customer", "Amount", "Due"]);
    ws.addRow(["INV-9001", "Grove Outfitters", 1500.25, new Date(Date.UTC(2026, 9, 31))]);
    ws.addRow(["INV-9002", "Heath & Co", { formula: "1000+250.5", result: 1250.5 }, new Date(Date.UTC(2026, 10, 15))]);
    ws.getCell("D2").numFmt = "yyyy-mm-dd";
    ws.getCell("D3").numFmt = "yyyy-mm-dd";
    return new Uint8Array(await wb.xlsx.writeBuffer());
  }

  it("lists the sheets, re-inspects the chosen one, and loads formula results and dates", async () => {
    const up = await upload(senior, engagement, "ledger.xlsx", await workbook());
    expect(up.status).toBe(201);
    expect(up.json.upload.inspection.sheets).toEqual(["Notes", "Receivables"]);
    expect(up.json.upload.inspection.sheet).toBe("Receivables"); // the notes sheet is not a ledger
    const params = { engagementId: String(engagement), uploadId: String(up.json.upload.id) };
    const chosen = await call(inspect.GET, "GET", { as: senior, params, query: { sheet: "Receivables" } });
    expect(chosen.json.upload.inspection.headers).toEqual(["Invoice", "Customer", "Amount", "Due"]);
    const { callEvents } = await import("./support/call");
    const load = await import("@/app/api/engagements/[engagementId]/populations/uploads/[uploadId]/load/route");
    const loaded = await callEvents(load.POST, "POST", {
      as: senior,
      params,
      body: {
        name: "Receivables (xlsx)",
        mapping: { ...RECEIVABLES_MAPPING, dateColumn: "Due", sheet: "Receivables" },
      },
    });
    expect(loaded.last).toMatchObject({ type: "loaded", rowCount: 2, total: "2750.75" });
    const items = await getDb()("population_items")
      .where({ population_id: loaded.last.populationId })
      .orderBy("row_number");
    expect(items.map((i) => [i.item_ref, i.book_value, i.item_date])).toEqual([
      ["INV-9001", "1500.25", "2026-10-31"],
      ["INV-9002", "1250.50", "2026-11-15"],
    ]);
  });
});

describe("who may upload", () => {
  it("refuses staff with 403 and a user from another engagement with 404", async () => {
    expect((await upload(staff, engagement, "r.csv", GOOD_CSV)).status).toBe(403);
    expect((await upload(outsider, engagement, "r.csv", GOOD_CSV)).status).toBe(404);
  });

  it("refuses a second upload while the same person has a load running", async () => {
    const first = await upload(senior, engagement, "first.csv", GOOD_CSV);
    // A load running on some app server: the upload claimed, its lease live.
    await claimUploadForLoading(getDb(), { uploadId: first.json.upload.id, userId: senior, holder: "a-live-server" });
    const second = await upload(senior, engagement, "second.csv", GOOD_CSV);
    expect(second.status).toBe(409);
    expect(second.json.error.message).toMatch(/already have a ledger loading \(first\.csv\)/);
    await getDb()("population_uploads").where({ id: first.json.upload.id }).update({ status: "rejected" });
    await getDb()("population_upload_leases").where({ upload_id: first.json.upload.id }).del();
  });

  it("does not let an upload be loaded on another engagement", async () => {
    const up = await upload(senior, engagement, "mine.csv", GOOD_CSV);
    const load = await import("@/app/api/engagements/[engagementId]/populations/uploads/[uploadId]/load/route");
    const r = await call(load.POST, "POST", {
      as: outsider,
      params: { engagementId: String(other), uploadId: String(up.json.upload.id) },
      body: { name: "Stolen", mapping: RECEIVABLES_MAPPING },
    });
    expect(r.status).toBe(404);
  });
});

async function storedUploadKeys(engagementId: number): Promise<string[]> {
  const { client, bucket } = getStorage();
  const listed = await client.send(
    new ListObjectsV2Command({ Bucket: bucket, Prefix: uploadObjectKey(engagementId, "") }),
  );
  return (listed.Contents ?? []).map((object) => object.Key ?? "").sort();
}
