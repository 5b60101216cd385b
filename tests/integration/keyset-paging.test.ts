import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { call } from "./support/call";
import { makeEngagement, makeFirm, makeUser } from "./support/factory";
import { uploadAndLoad } from "./support/populations";
import { drawSample, planSample } from "./support/samples";
import * as populationItems from "@/app/api/engagements/[engagementId]/populations/[populationId]/items/route";
import * as sampleItems from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/route";
import * as reconcile from "@/app/api/engagements/[engagementId]/populations/[populationId]/reconciliation/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

// 57 rows with repeated references and repeated amounts, so every sort has ties the row number must break.
const ROWS = Array.from({ length: 57 }, (_, i) => ({
  ref: `R-${String(i % 20).padStart(2, "0")}`,
  amount: ((i * 37) % 11) * 10 + 0.25,
  row: i + 2,
}));
const CSV = [
  "Invoice,Customer,Amount",
  ...ROWS.map((r) => `${r.ref},Customer ${r.row},${r.amount.toFixed(2)}`),
  "",
].join("\n");

let senior: number, engagement: number, populationId: number;
type Item = { rowNumber: number; itemRef: string; bookValue: string };
type Page = { items: Item[]; total: number; page: number; nextCursor: string | null; prevCursor: string | null };

beforeAll(async () => {
  const firm = await makeFirm();
  senior = await makeUser(firm, "senior");
  const manager = await makeUser(firm, "manager");
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
  ]);
  const { loaded } = await uploadAndLoad(senior, engagement, "keyset.csv", CSV);
  if (loaded?.last?.type !== "loaded") throw new Error(JSON.stringify(loaded?.last));
  populationId = loaded.last.populationId as number;
});

afterAll(async () => {
  await getDb().destroy();
});

const popPage = async (query: Record<string, string>) => {
  const r = await call(populationItems.GET, "GET", {
    as: senior,
    params: { engagementId: String(engagement), populationId: String(populationId) },
    query,
  });
  return { status: r.status, body: r.json as Page };
};

/** The order the grid promises, computed here independently: sort value, then row number (common practice for a stable keyset). */
function expectedOrder(sort: "row" | "ref" | "book", dir: "asc" | "desc"): number[] {
  const value = (r: (typeof ROWS)[number]) => (sort === "ref" ? r.ref : sort === "book" ? r.amount : r.row);
  const sorted = [...ROWS].sort((a, b) => {
    const va = value(a),
      vb = value(b);
    const c = va < vb ? -1 : va > vb ? 1 : a.row - b.row;
    return dir === "asc" ? c : -c;
  });
  return sorted.map((r) => r.row);
}

describe("population items paged by key", () => {
  for (const sort of ["row", "ref", "book"] as const) {
    for (const dir of ["asc", "desc"] as const) {
      it(`walks every row once by ${sort} ${dir}, forwards with after= and backwards with before= from last=true`, async () => {
        const forward: number[] = [];
        let cursor: string | null = null;
        let pages = 0;
        do {
          const { status, body } = await popPage({ sort, dir, pageSize: "10", ...(cursor ? { after: cursor } : {}) });
          expect(status).toBe(200);
          expect(body.total).toBe(57);
          if (pages === 0) expect(body.prevCursor).toBeNull();
          forward.push(...body.items.map((i) => i.rowNumber));
          cursor = body.nextCursor;
          pages++;
        } while (cursor && pages < 20);
        expect(pages).toBe(6);
        expect(forward).toEqual(expectedOrder(sort, dir));

        const last = await popPage({ sort, dir, pageSize: "10", last: "true" });
        expect(last.body.page).toBe(6);
        expect(last.body.items).toHaveLength(7);
        expect(last.body.nextCursor).toBeNull();
        const backward: number[][] = [last.body.items.map((i) => i.rowNumber)];
        let before = last.body.prevCursor;
        while (before) {
          const { body } = await popPage({ sort, dir, pageSize: "10", before });
          backward.unshift(body.items.map((i) => i.rowNumber));
          before = body.prevCursor;
        }
        expect(backward.map((p) => p.length)).toEqual([10, 10, 10, 10, 10, 7]);
        expect(backward.flat()).toEqual(expectedOrder(sort, dir));
      });
    }
  }

  it("answers a page number without a cursor as before (offset), the same rows the cursors reach", async () => {
    const third = await popPage({ sort: "book", dir: "desc", pageSize: "10", page: "3" });
    expect(third.body.items.map((i) => i.rowNumber)).toEqual(expectedOrder("book", "desc").slice(20, 30));
    expect(third.body.prevCursor).not.toBeNull();
  });

  it("pages a search by key and counts its matches", async () => {
    const { body } = await popPage({ q: "R-07", pageSize: "10" });
    expect(body.total).toBe(ROWS.filter((r) => r.ref === "R-07").length);
    expect(body.items.map((i) => i.rowNumber)).toEqual(ROWS.filter((r) => r.ref === "R-07").map((r) => r.row));
    expect(body.nextCursor).toBeNull();
  });

  it("refuses a cursor it did not write, naming the field", async () => {
    const r = await popPage({ after: "not-a-cursor" });
    expect(r.status).toBe(400);
    expect(JSON.stringify(r.body)).toContain("after");
    const both = await popPage({ after: "WzEsMl0", last: "true" });
    expect(both.status).toBe(400);
  });
});

describe("sample items paged by key", () => {
  it("walks a drawn sample in selection order, forwards and back", async () => {
    await call(reconcile.POST, "POST", {
      as: senior,
      params: { engagementId: String(engagement), populationId: String(populationId) },
      body: { controlTotal: ROWS.reduce((s, r) => s + r.amount, 0).toFixed(2), controlCount: 57 },
    });
    const planned = await planSample(senior, engagement, {
      populationId,
      params: {
        method: "random",
        estimator: "difference",
        tolerableMisstatement: "500",
        sampleSize: 23,
        sizeReason: "paging test",
      },
    });
    expect(planned.status).toBe(201);
    const sampleId = planned.json.sample.id as number;
    expect((await drawSample(senior, engagement, sampleId, 7)).status).toBe(201);
    const get = async (query: Record<string, string>) =>
      (
        await call(sampleItems.GET, "GET", {
          as: senior,
          params: { engagementId: String(engagement), sampleId: String(sampleId) },
          query,
        })
      ).json as {
        items: { id: number; selectionOrder: number }[];
        total: number;
        nextCursor: string | null;
        prevCursor: string | null;
      };
    const all = (await get({ pageSize: "500" })).items.map((i) => i.id);
    expect(all).toHaveLength(23);
    const walked: number[] = [];
    let page = await get({ pageSize: "10" });
    walked.push(...page.items.map((i) => i.id));
    while (page.nextCursor) {
      page = await get({ pageSize: "10", after: page.nextCursor });
      walked.push(...page.items.map((i) => i.id));
    }
    expect(walked).toEqual(all);
    const last = await get({ pageSize: "10", last: "true" });
    expect(last.items.map((i) => i.id)).toEqual(all.slice(20));
    const middle = await get({ pageSize: "10", before: last.prevCursor! });
    expect(middle.items.map((i) => i.id)).toEqual(all.slice(10, 20));
  });
});
