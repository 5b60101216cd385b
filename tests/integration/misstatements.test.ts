// The summary of misstatements through its API, against the real database: rows fed live from a
// sample's results, frozen at the sample's lock; the team's entries and who may make them; 404 across
// engagements and for the client's staff; sign-offs, lock with a stored PDF, partner unlock; exports.
import { createHash } from "node:crypto";
import ExcelJS from "exceljs";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
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
import * as summary from "@/app/api/engagements/[engagementId]/misstatements/route";
import * as entries from "@/app/api/engagements/[engagementId]/misstatements/entries/route";
import * as entry from "@/app/api/engagements/[engagementId]/misstatements/entries/[entryId]/route";
import * as entryEvidence from "@/app/api/engagements/[engagementId]/misstatements/entries/[entryId]/evidence/route";
import * as settings from "@/app/api/engagements/[engagementId]/misstatements/settings/route";
import * as corrections from "@/app/api/engagements/[engagementId]/misstatements/corrections/route";
import * as summarySignOff from "@/app/api/engagements/[engagementId]/misstatements/sign-off/route";
import * as summaryNotes from "@/app/api/engagements/[engagementId]/misstatements/notes/route";
import * as summaryLock from "@/app/api/engagements/[engagementId]/misstatements/lock/route";
import * as summaryUnlock from "@/app/api/engagements/[engagementId]/misstatements/unlock/route";
import * as summaryWorkbook from "@/app/api/engagements/[engagementId]/misstatements/workbook/route";
import * as summaryWorkpaper from "@/app/api/engagements/[engagementId]/misstatements/workpaper/route";
import * as sampleSignOff from "@/app/api/engagements/[engagementId]/samples/[sampleId]/sign-off/route";
import * as sampleLock from "@/app/api/engagements/[engagementId]/samples/[sampleId]/lock/route";
import * as sampleUnlock from "@/app/api/engagements/[engagementId]/samples/[sampleId]/unlock/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let viewer: number, staff: number, senior: number, manager: number, partner: number, client: number, outsider: number;
let engagement: number, other: number, sampleId: number;
const e = (id = engagement, extra: Record<string, string> = {}) => ({ engagementId: String(id), ...extra });
const getSummary = async (as = viewer, id = engagement) => call(summary.GET, "GET", { as, params: e(id) });
const JUDGEMENT = {
  kind: "judgemental",
  account: "Warranty provision",
  assertion: "Valuation",
  description: "Provision understated: management's return rate is below the last three years' experience",
  amount: "-4200.00",
  incomeEffect: "4200.00",
  balanceEffect: "4200.00",
};

beforeAll(async () => {
  const firm = await makeFirm();
  [viewer, staff, senior, manager, partner, client, outsider] = await Promise.all([
    makeUser(firm, "staff"),
    makeUser(firm, "staff"),
    makeUser(firm, "senior"),
    makeUser(firm, "manager"),
    makeUser(firm, "partner"),
    makeUser(firm, "client"),
    makeUser(firm, "manager"),
  ]);
  engagement = await makeEngagement(firm, manager, [
    [viewer, "viewer"],
    [staff, "staff"],
    [senior, "senior"],
    [manager, "manager"],
    [partner, "partner"],
    [client, "client"],
  ]);
  other = await makeEngagement(firm, outsider, [[outsider, "manager"]]);
  const { populationId } = await loadCanonicalPopulation(senior, engagement);
  sampleId = (
    await planSample(senior, engagement, {
      populationId,
      params: { method: "mus", tolerableMisstatement: "15000", factorMode: "table" },
    })
  ).json.sample.id;
  await drawSample(senior, engagement, sampleId, 1206281);
  for (const it of await listSampleItems(staff, engagement, sampleId)) {
    await saveResult(staff, engagement, sampleId, it.id, {
      version: it.version,
      status: "done",
      auditedValue: it.itemRef === "INV011" ? "3690.00" : it.bookValue,
      cause: it.itemRef === "INV011" ? "cut-off" : null,
    });
  }
});

afterAll(async () => {
  await getDb().destroy();
});

const rowOf = (
  json: { summary: { rows: { key: string; amount: string; allowance: string | null; frozen: boolean }[] } },
  key: string,
) => json.summary.rows.find((r) => r.key === key);

describe("rows fed live from the sample's results", () => {
  it("carries the sample's factual, projected and allowance as its own evaluation gives them", async () => {
    const ev = await getEvaluation(viewer, engagement, sampleId);
    const r = await getSummary();
    expect(r.status).toBe(200);
    expect(rowOf(r.json, `s${sampleId}-factual`)?.amount).toBe(ev.progress.misstatementTotal);
    expect(ev.progress.misstatementTotal).toBe("410.00"); // INV011: 4,100.00 − 3,690.00
    expect(Number(rowOf(r.json, `s${sampleId}-projected`)?.amount)).toBeCloseTo(
      Number(ev.projectedMisstatement) - 410,
      2,
    );
    const over = ev.block.overstatement;
    expect(Number(rowOf(r.json, `s${sampleId}-projected`)?.allowance)).toBeCloseTo(
      Number(over.upperLimit) - Number(over.projected),
      2,
    );
    expect(r.json.summary.materiality).toMatchObject({ overall: "100000.00", performance: "75000.00" });
    expect(r.json.summary.samples[0]).toMatchObject({ sampleId, state: "contributes", locked: false });
  });

  it("changes the row when a result changes", async () => {
    const inv = (await listSampleItems(staff, engagement, sampleId)).find((i) => i.itemRef === "INV011")!;
    await saveResult(staff, engagement, sampleId, inv.id, {
      version: inv.version,
      status: "done",
      auditedValue: "3280.00",
      cause: "cut-off",
    });
    expect(rowOf((await getSummary()).json, `s${sampleId}-factual`)?.amount).toBe("820.00");
  });
});

describe("sign-offs and the live rows", () => {
  it("refuses the reviewer before the preparer has signed (409 in the words the page shows beside the disabled button)", async () => {
    const before = (await getSummary()).json.summary.review;
    expect(before).toMatchObject({ preparer: null, reviewer: null });
    expect(before.reviewerBlocker).toBe(
      "The preparer (staff or senior) signs off the summary first; the reviewer signs after.",
    );
    const r = await call(summarySignOff.POST, "POST", { as: manager, params: e(), body: { as: "reviewer" } });
    expect(r.status).toBe(409);
    expect(r.json.error).toEqual({ code: "preparer_not_signed", message: before.reviewerBlocker });
    expect((await getSummary()).json.summary.review.reviewer).toBeNull();
  });

  it("shows a sign-off as no longer applying when a sample's results move the rows, and refuses the reviewer until the preparer signs again", async () => {
    expect(
      (await call(summarySignOff.POST, "POST", { as: senior, params: e(), body: { as: "preparer" } })).status,
    ).toBe(200);
    expect((await getSummary()).json.summary.review).toMatchObject({
      staleSignOffs: false,
      preparer: { role: "Senior" }, // as people read it (ROLE_LABELS)
      reviewerBlocker: null,
    });
    const inv = (await listSampleItems(staff, engagement, sampleId)).find((i) => i.itemRef === "INV011")!;
    await saveResult(staff, engagement, sampleId, inv.id, {
      version: inv.version,
      status: "done",
      auditedValue: "3280.00",
      cause: "cut-off",
      comment: "Re-checked",
    });
    expect((await getSummary()).json.summary.review).toMatchObject({ staleSignOffs: false }); // the figures did not move: the comment is not on the summary
    const moved = (await listSampleItems(staff, engagement, sampleId)).find((i) => i.itemRef === "INV011")!;
    await saveResult(staff, engagement, sampleId, moved.id, {
      version: moved.version,
      status: "done",
      auditedValue: "3300.00",
      cause: "cut-off",
    });
    expect((await getSummary()).json.summary.review).toMatchObject({ staleSignOffs: true, preparer: null });
    const r = await call(summarySignOff.POST, "POST", { as: manager, params: e(), body: { as: "reviewer" } });
    expect(r.status).toBe(409);
    expect(r.json.error.code).toBe("rows_changed");
    expect(r.json.error.message).toMatch(/changed after the preparer signed off/);
    expect((await getSummary()).json.summary.review.reviewerBlocker).toBe(r.json.error.message);
    await saveResult(staff, engagement, sampleId, moved.id, {
      version: moved.version + 1,
      status: "done",
      auditedValue: "3280.00",
      cause: "cut-off",
    });
  });
});

describe("entries by the team", () => {
  it("lets staff add a judgemental misstatement and refuses a viewer", async () => {
    expect((await call(entries.POST, "POST", { as: viewer, params: e(), body: JUDGEMENT })).status).toBe(403);
    const before = await auditCount({ entity: "misstatement_entry" });
    const r = await call(entries.POST, "POST", { as: staff, params: e(), body: JUDGEMENT });
    expect(r.status).toBe(201);
    expect(r.json.entry).toMatchObject({ kind: "judgemental", amount: "-4200.00", version: 1 });
    expect(rowOf(r.json, `e${r.json.entry.id}`)).toMatchObject({ amount: "-4200.00", accumulated: true });
    expect(await auditCount({ entity: "misstatement_entry" })).toBe(before + 1);
    expect(r.json.summary.trail.at(-1)).toMatchObject({ action: "create", subject: `entry ${r.json.entry.id}` });
  });

  it("answers 400 naming the field and stores nothing", async () => {
    const count = async () =>
      Number((await getDb()("misstatement_entries").where({ engagement_id: engagement }).count({ n: "*" }).first())?.n);
    const before = await count();
    const r = await call(entries.POST, "POST", { as: staff, params: e(), body: { ...JUDGEMENT, amount: "12.345" } });
    expect(r.status).toBe(400);
    expect(Object.keys(r.json.error.fields)).toEqual(["amount"]);
    expect(await count()).toBe(before);
  });

  it("keeps evidence files on an entry with the evidence store", async () => {
    const id = (
      await call(entries.POST, "POST", {
        as: staff,
        params: e(),
        body: { ...JUDGEMENT, kind: "factual", amount: "950.00", description: "Duplicate invoice posted twice" },
      })
    ).json.entry.id;
    const pdf = new TextEncoder().encode(
      "%PDF-1.7\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n",
    ); // ISO 32000-1 §7.5.2 header
    const up = await call(entryEvidence.POST, "POST", {
      as: staff,
      params: e(engagement, { entryId: String(id) }),
      query: { fileName: "duplicate.pdf" },
      file: pdf,
    });
    expect(up.status).toBe(201);
    expect(up.json.evidence).toMatchObject({
      fileName: "duplicate.pdf",
      contentType: "application/pdf",
      sha256: createHash("sha256").update(pdf).digest("hex"),
    });
    expect(rowOf((await getSummary()).json, `e${id}`)).toMatchObject({ evidenceCount: 1 });
    expect(
      (
        await call(entryEvidence.POST, "POST", {
          as: viewer,
          params: e(engagement, { entryId: String(id) }),
          query: { fileName: "x.pdf" },
          file: pdf,
        })
      ).status,
    ).toBe(403);
  });

  it("lists an entry below the clearly trivial threshold without accumulating it (threshold set by a manager)", async () => {
    expect(
      (
        await call(settings.PUT, "PUT", {
          as: senior,
          params: e(),
          body: { clearlyTrivial: "1000", approachingShare: 0.75 },
        })
      ).status,
    ).toBe(403);
    const r = await call(settings.PUT, "PUT", {
      as: manager,
      params: e(),
      body: { clearlyTrivial: "1000", approachingShare: 0.75 },
    });
    expect(r.status).toBe(200);
    const trivial = r.json.summary.rows.find(
      (x: { description: string }) => x.description === "Duplicate invoice posted twice",
    );
    expect(trivial).toMatchObject({ clearlyTrivial: true, accumulated: false });
  });

  it("marks a sample's factual part corrected by the client", async () => {
    const r = await call(corrections.POST, "POST", {
      as: staff,
      params: e(),
      body: { sampleId, part: "factual", corrected: { on: "2026-12-20", reference: "AJE 7" } },
    });
    expect(r.status).toBe(200);
    expect(rowOf(r.json, `s${sampleId}-factual`)).toMatchObject({
      accumulated: false,
      corrected: { on: "2026-12-20", reference: "AJE 7" },
    });
    expect(r.json.summary.totals.corrected).toMatchObject({ total: "820.00", count: 1 });
  });

  it("refuses stale edits and keeps a deleted entry out of the schedule", async () => {
    const created = (
      await call(entries.POST, "POST", { as: staff, params: e(), body: { ...JUDGEMENT, description: "To be removed" } })
    ).json.entry;
    const p = e(engagement, { entryId: String(created.id) });
    expect(
      (await call(entry.PATCH, "PATCH", { as: staff, params: p, body: { ...JUDGEMENT, version: 1, amount: "-4300" } }))
        .status,
    ).toBe(200);
    expect(
      (await call(entry.PATCH, "PATCH", { as: staff, params: p, body: { ...JUDGEMENT, version: 1, amount: "-4400" } }))
        .status,
    ).toBe(409);
    expect((await call(entry.DELETE, "DELETE", { as: staff, params: p })).status).toBe(204);
    expect(rowOf((await getSummary()).json, `e${created.id}`)).toBeUndefined();
  });
});

describe("who sees it", () => {
  it("answers 404 to another engagement's team, the client's staff, and an entry under another engagement", async () => {
    expect((await getSummary(outsider)).status).toBe(404);
    expect((await getSummary(client)).status).toBe(404);
    const id = (await call(entries.POST, "POST", { as: staff, params: e(), body: JUDGEMENT })).json.entry.id;
    expect(
      (
        await call(entry.PATCH, "PATCH", {
          as: outsider,
          params: e(other, { entryId: String(id) }),
          body: { ...JUDGEMENT, version: 1 },
        })
      ).status,
    ).toBe(404);
    expect((await call(entries.POST, "POST", { as: client, params: e(), body: JUDGEMENT })).status).toBe(404);
  });
});

describe("exports", () => {
  it("writes the schedule as a workbook whose text cells cannot run as formulas", async () => {
    await call(entries.POST, "POST", {
      as: staff,
      params: e(),
      body: { ...JUDGEMENT, description: '=HYPERLINK("http://x.example","click")', account: "+Accruals" },
    });
    const res = await callRaw(summaryWorkbook.GET, "GET", { as: viewer, params: e() });
    expect(res.status).toBe(200);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(Buffer.from(await res.arrayBuffer()) as unknown as ArrayBuffer);
    const texts: string[] = [];
    wb.eachSheet((ws) =>
      ws.eachRow((row) =>
        row.eachCell((cell) => {
          expect(cell.type).not.toBe(ExcelJS.ValueType.Formula);
          if (typeof cell.value === "string") texts.push(cell.value);
        }),
      ),
    );
    expect(texts.filter((t) => /^[=+\-@\t\r]/.test(t))).toEqual([]);
    expect(texts).toContain('\'=HYPERLINK("http://x.example","click")');
  });

  it("renders a draft PDF before lock", async () => {
    const res = await callRaw(summaryWorkpaper.GET, "GET", { as: viewer, params: e() });
    expect(res.status).toBe(200);
    expect(
      Buffer.from(await res.arrayBuffer())
        .subarray(0, 5)
        .toString(),
    ).toBe("%PDF-");
    expect(res.headers.get("content-disposition")).toMatch(/DRAFT/);
  });
});

describe("locking", () => {
  it("refuses to lock while a feeding sample is unlocked", async () => {
    const r = await call(summaryLock.POST, "POST", { as: manager, params: e() });
    expect(r.status).toBe(409);
    expect(r.json.error.message).toMatch(/must be locked first/);
  });

  it("freezes a locked sample's row: later changes to its stored results do not move it", async () => {
    const sp = { engagementId: String(engagement), sampleId: String(sampleId) };
    expect((await concludeSample(staff, engagement, sampleId)).status).toBe(200);
    expect((await call(sampleSignOff.POST, "POST", { as: staff, params: sp, body: { as: "preparer" } })).status).toBe(
      200,
    );
    expect((await call(sampleSignOff.POST, "POST", { as: manager, params: sp, body: { as: "reviewer" } })).status).toBe(
      200,
    );
    expect((await call(sampleLock.POST, "POST", { as: manager, params: sp })).status).toBe(200);
    const atLock = rowOf((await getSummary()).json, `s${sampleId}-projected`)!;
    expect(atLock.frozen).toBe(true);
    // What a change after lock would look like (the lock refuses writes, so it is made in the database directly).
    await getDb()("sample_items")
      .where({ sample_id: sampleId })
      .update({ audited_value: getDb().raw("book_value * 0.5") });
    expect(rowOf((await getSummary()).json, `s${sampleId}-projected`)).toEqual(atLock);
    // Unlocked by a partner, the row is live again and shows the changed results.
    expect(
      (
        await call(sampleUnlock.POST, "POST", {
          as: partner,
          params: sp,
          body: { reason: "Checking the stored results after lock" },
        })
      ).status,
    ).toBe(200);
    const live = rowOf((await getSummary()).json, `s${sampleId}-projected`)!;
    expect(live.frozen).toBe(false);
    expect(live.amount).not.toBe(atLock.amount);
  });

  it("signs off, locks with a stored PDF and its SHA-256, refuses writes, and unlocks for a partner with a reason", async () => {
    const sp = { engagementId: String(engagement), sampleId: String(sampleId) };
    await getDb()("sample_items")
      .where({ sample_id: sampleId })
      .update({ audited_value: getDb().raw("book_value") });
    expect((await concludeSample(staff, engagement, sampleId)).status).toBe(200);
    expect((await call(sampleSignOff.POST, "POST", { as: staff, params: sp, body: { as: "preparer" } })).status).toBe(
      200,
    );
    expect((await call(sampleSignOff.POST, "POST", { as: manager, params: sp, body: { as: "reviewer" } })).status).toBe(
      200,
    );
    expect((await call(sampleLock.POST, "POST", { as: manager, params: sp })).status).toBe(200);

    expect(
      (await call(summaryNotes.POST, "POST", { as: staff, params: e(), body: { text: "Please check" } })).status,
    ).toBe(403);
    expect(
      (await call(summarySignOff.POST, "POST", { as: manager, params: e(), body: { as: "preparer" } })).status,
    ).toBe(403);
    expect(
      (await call(summarySignOff.POST, "POST", { as: senior, params: e(), body: { as: "preparer" } })).status,
    ).toBe(200);
    // Any change clears the sign-offs.
    const changed = await call(entries.POST, "POST", {
      as: staff,
      params: e(),
      body: { ...JUDGEMENT, amount: "-100.00", description: "Late change" },
    });
    expect(changed.json.signOffsCleared).toBe(true);
    expect(changed.json.summary.review.preparer).toBeNull();
    expect(
      (await call(summarySignOff.POST, "POST", { as: senior, params: e(), body: { as: "preparer" } })).status,
    ).toBe(200);
    expect((await call(summaryLock.POST, "POST", { as: manager, params: e() })).status).toBe(409); // no reviewer yet
    expect(
      (await call(summarySignOff.POST, "POST", { as: manager, params: e(), body: { as: "reviewer" } })).status,
    ).toBe(200);
    expect((await call(summaryLock.POST, "POST", { as: senior, params: e() })).status).toBe(403);
    const locked = await call(summaryLock.POST, "POST", { as: manager, params: e() });
    expect(locked.status).toBe(200);
    expect(locked.json.summary.review.lock).toMatchObject({
      workpaperSha256: locked.json.locked.sha256,
      reference: `WP-${engagement}-MIS`,
    });
    // Read back from the view frozen at lock (through its stored schema): the same rows, the lock's own fields.
    const reread = (await getSummary()).json.summary;
    expect(reread.rows).toEqual(locked.json.summary.rows);
    expect(reread.review).toMatchObject({ reviewerBlocker: "The summary is locked.", lockable: { ok: false } });

    const pdf = await callRaw(summaryWorkpaper.GET, "GET", { as: viewer, params: e() });
    const bytes = Buffer.from(await pdf.arrayBuffer());
    expect(createHash("sha256").update(bytes).digest("hex")).toBe(locked.json.locked.sha256);
    expect(pdf.headers.get("x-content-sha256")).toBe(locked.json.locked.sha256);
    expect((await call(entries.POST, "POST", { as: staff, params: e(), body: JUDGEMENT })).status).toBe(409);

    expect(
      (
        await call(summaryUnlock.POST, "POST", {
          as: manager,
          params: e(),
          body: { reason: "Client posted a late adjustment" },
        })
      ).status,
    ).toBe(403);
    expect(
      (await call(summaryUnlock.POST, "POST", { as: partner, params: e(), body: { reason: "short" } })).status,
    ).toBe(400);
    const unlocked = await call(summaryUnlock.POST, "POST", {
      as: partner,
      params: e(),
      body: { reason: "Client posted a late adjustment" },
    });
    expect(unlocked.status).toBe(200);
    expect(unlocked.json.summary.review).toMatchObject({ lock: null, reviewer: null });
    expect(await auditCount({ entity: "misstatement_summary", action: "unlock" })).toBeGreaterThan(0);
  });
});
