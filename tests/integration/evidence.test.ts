import { createHash, randomBytes } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import ExcelJS from "exceljs";
import { getDb } from "@/db/knex";
import { call, callRaw } from "./support/call";
import { auditCount, makeEngagement, makeFirm, makeUser } from "./support/factory";
import { drawSample, listSampleItems, loadCanonicalPopulation, planSample } from "./support/samples";
import * as evidenceList from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/[itemId]/evidence/route";
import * as evidenceOne from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/[itemId]/evidence/[evidenceId]/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let senior: number, staff: number, viewer: number, client: number, outsider: number;
let engagement: number, sampleId: number, itemId: number, otherItemId: number;

beforeAll(async () => {
  const firm = await makeFirm();
  [senior, staff, viewer, client, outsider] = await Promise.all([
    makeUser(firm, "senior"),
    makeUser(firm, "staff"),
    makeUser(firm, "staff"),
    makeUser(firm, "client"),
    makeUser(firm, "senior"),
  ]);
  const manager = await makeUser(firm, "manager");
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
    [staff, "staff"],
    [viewer, "viewer"],
    [client, "client"],
  ]);
  await makeEngagement(firm, manager, [
    [manager, "manager"],
    [outsider, "senior"],
  ]);
  const { populationId } = await loadCanonicalPopulation(senior, engagement);
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
  await drawSample(senior, engagement, sampleId, 7);
  const items = await listSampleItems(senior, engagement, sampleId);
  [itemId, otherItemId] = [items[0].id, items[1].id];
});

afterAll(async () => {
  await getDb().destroy();
});

const routeParams = (item = itemId, evidenceId?: number) => ({
  engagementId: String(engagement),
  sampleId: String(sampleId),
  itemId: String(item),
  ...(evidenceId ? { evidenceId: String(evidenceId) } : {}),
});
const upload = (as: number, fileName: string, file: Uint8Array, item = itemId) =>
  call(evidenceList.POST, "POST", { as, params: routeParams(item), query: { fileName }, file });
const list = (as: number, query: Record<string, string> = {}, item = itemId) =>
  call(evidenceList.GET, "GET", { as, params: routeParams(item), query });
const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");
const ascii = (s: string) => new TextEncoder().encode(s);

// ISO 32000-1:2008 §7.5.2: a PDF file begins with "%PDF-1.n".
const PDF = ascii("%PDF-1.7\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n");
// PNG (ISO/IEC 15948) §5.2 signature, followed here by 2 MB of other bytes: the fake must store them unchanged.
const BIG_PNG = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, ...randomBytes(2 * 1024 * 1024)]);

describe("evidence files", () => {
  it("uploads, lists and downloads the same bytes, with the SHA-256 recorded and audit rows", async () => {
    const up = await upload(staff, "confirmation.pdf", PDF);
    expect(up.status).toBe(201);
    expect(up.json.evidence).toMatchObject({
      fileName: "confirmation.pdf",
      contentType: "application/pdf",
      sizeBytes: PDF.length,
      sha256: sha(PDF),
    });
    expect(up.json.evidence.objectKey).toBeUndefined();
    const big = await upload(staff, "scan.png", BIG_PNG);
    expect(big.status).toBe(201);

    const listed = await list(viewer);
    expect(listed.json.evidence.map((e: { fileName: string }) => e.fileName)).toEqual(["confirmation.pdf", "scan.png"]);
    const items = await listSampleItems(viewer, engagement, sampleId);
    expect(items.find((i) => i.id === itemId)).toMatchObject({ evidenceCount: 2 });
    expect(items.find((i) => i.id === otherItemId)).toMatchObject({ evidenceCount: 0 });

    for (const [evidence, bytes] of [
      [up.json.evidence, PDF],
      [big.json.evidence, BIG_PNG],
    ] as const) {
      const res = await callRaw(evidenceOne.GET, "GET", { as: viewer, params: routeParams(itemId, evidence.id) });
      expect(res.status).toBe(200);
      expect(res.headers.get("x-content-type-options")).toBe("nosniff");
      expect(res.headers.get("content-disposition")).toContain(`filename="${evidence.fileName}"`);
      const downloaded = new Uint8Array(await res.arrayBuffer());
      expect(sha(downloaded)).toBe(sha(bytes));
      expect(res.headers.get("x-content-sha256")).toBe(sha(bytes));
    }
    expect(
      await auditCount({ entity: "item_evidence", entity_id: String(up.json.evidence.id), action: "upload" }),
    ).toBe(1);
  });

  it("decides the type by content: a renamed program or unknown bytes are refused (415), a PNG named .pdf is stored as a PNG", async () => {
    const exe = new Uint8Array([0x4d, 0x5a, 0x90, 0x00, 0x03, 0x00, 0x00, 0x00, ...randomBytes(512)]);
    const refused = await upload(staff, "invoice.pdf", exe);
    expect(refused.status).toBe(415);
    expect(refused.json.error.message).toMatch(/Windows program, whatever its name/);
    const junk = await upload(staff, "statement.pdf", new Uint8Array([0x00, 0x01, 0x02, 0x03, 0xfe, 0xff, 0x80, 0x81]));
    expect(junk.status).toBe(415);
    expect(junk.json.error.message).toMatch(/begins with the bytes 00 01 02 03/);
    const png = await upload(staff, "looks-like.pdf", BIG_PNG.subarray(0, 100));
    expect(png.json.evidence.contentType).toBe("image/png");
  });

  it("accepts an Excel workbook and an e-mail message by their content", async () => {
    const wb = new ExcelJS.Workbook();
    wb.addWorksheet("Confirmations").addRow(["INV001", 1250]);
    const xlsx = new Uint8Array(await wb.xlsx.writeBuffer());
    expect((await upload(staff, "confirmations.bin", xlsx)).json.evidence.contentType).toBe(
      "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet",
    );
    const eml = ascii(
      "From: Carla <carla@client.example>\r\nTo: audit@firm.example\r\nDate: Tue, 1 Dec 2026 10:00:00 +0000\r\nSubject: Confirmation\r\n\r\nWe confirm the balance.\r\n",
    );
    expect((await upload(staff, "reply.eml", eml)).json.evidence.contentType).toBe("message/rfc822");
  });

  it("refuses a file over the 25 MB limit with 413 naming it", async () => {
    const res = await upload(staff, "huge.pdf", new Uint8Array(25 * 1024 * 1024 + 1));
    expect(res.status).toBe(413);
    expect(res.json.error.message).toMatch(/25 MB limit/);
  });

  it("lets staff upload, viewers only read, and hides everything from another engagement and from client contacts (404)", async () => {
    expect((await upload(staff, "a.txt", ascii("tick marks\n"))).status).toBe(201);
    const clientUp = await upload(staff, "remittance.csv", ascii("ref,amount\nINV001,1250.00\n"));
    expect(clientUp.status).toBe(201);
    expect(clientUp.json.evidence.contentType).toBe("text/csv; charset=utf-8");
    // Client contacts supply files through request lists (client-requests.test.ts), never here.
    expect((await upload(client, "remittance.csv", ascii("ref,amount\nINV001,1250.00\n"))).status).toBe(404);
    expect((await list(client)).status).toBe(404);
    const refused = await upload(viewer, "b.txt", ascii("no\n"));
    expect(refused.status).toBe(403);
    expect((await list(viewer)).status).toBe(200);
    expect((await upload(outsider, "c.txt", ascii("x\n"))).status).toBe(404);
    expect((await list(outsider)).status).toBe(404);
    const someId = clientUp.json.evidence.id;
    expect((await callRaw(evidenceOne.GET, "GET", { as: outsider, params: routeParams(itemId, someId) })).status).toBe(
      404,
    );
    // The evidence id must belong to the item in the path.
    expect(
      (await callRaw(evidenceOne.GET, "GET", { as: staff, params: routeParams(otherItemId, someId) })).status,
    ).toBe(404);
  });

  it("deletes softly: gone from the list and downloads, kept with who deleted it; viewers and client contacts cannot delete", async () => {
    const mine = (await upload(senior, "note.txt", ascii("senior note\n"))).json.evidence;
    const staffs = (await upload(staff, "work.txt", ascii("auditor note\n"))).json.evidence;
    expect(
      (await call(evidenceOne.DELETE, "DELETE", { as: client, params: routeParams(itemId, staffs.id) })).status,
    ).toBe(404);
    expect(
      (await call(evidenceOne.DELETE, "DELETE", { as: viewer, params: routeParams(itemId, mine.id) })).status,
    ).toBe(403);
    expect((await call(evidenceOne.DELETE, "DELETE", { as: staff, params: routeParams(itemId, mine.id) })).status).toBe(
      204,
    );
    expect(
      (await call(evidenceOne.DELETE, "DELETE", { as: staff, params: routeParams(itemId, staffs.id) })).status,
    ).toBe(204);
    expect(
      (await call(evidenceOne.DELETE, "DELETE", { as: staff, params: routeParams(itemId, staffs.id) })).status,
    ).toBe(404);
    const ids = (await list(staff)).json.evidence.map((e: { id: number }) => e.id);
    expect(ids).not.toContain(mine.id);
    const all = (await list(staff, { includeDeleted: "true" })).json.evidence;
    expect(all.find((e: { id: number }) => e.id === staffs.id)).toMatchObject({
      deletedByName: expect.stringContaining("(staff)"),
      deletedAt: expect.any(String),
    });
    expect((await callRaw(evidenceOne.GET, "GET", { as: staff, params: routeParams(itemId, mine.id) })).status).toBe(
      404,
    );
    expect(await auditCount({ entity: "item_evidence", entity_id: String(mine.id), action: "delete" })).toBe(1);
    const row = (await getDb()("item_evidence").where({ id: mine.id }).first())!;
    expect(row.deleted_by).toBe(staff);
  });

  it("refuses uploads and deletions on a locked sample with 409", async () => {
    const kept = (await upload(staff, "kept.txt", ascii("kept\n"))).json.evidence;
    await getDb()("samples")
      .where({ id: sampleId })
      .update({ locked_at: getDb().fn.now(3) }); // the lock itself is tested with the review routes
    try {
      const up = await upload(staff, "late.txt", ascii("too late\n"));
      expect(up.status).toBe(409);
      expect(up.json.error.code).toBe("locked");
      expect(
        (await call(evidenceOne.DELETE, "DELETE", { as: staff, params: routeParams(itemId, kept.id) })).status,
      ).toBe(409);
    } finally {
      await getDb()("samples").where({ id: sampleId }).update({ locked_at: null });
    }
  });
});
