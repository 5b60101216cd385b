// Every route handler under app/api, called as a client contact of the engagement: a client may
// reach only the request lists addressed to them. Every route under /api/engagements/[engagementId]
// answers 404 (as for someone not on the engagement); every other route has its own row below, and
// a route file that has neither fails this test until a row is added.
import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { requireEngagementPage, requireWorkspaceUser } from "@/lib/auth/page-guards";
import { actAs } from "./support/session";
import { call, callRaw } from "./support/call";
import { makeEngagement, makeFirm, makeUser } from "./support/factory";
import { upload } from "./support/populations";
import { drawSample, listSampleItems, loadCanonicalPopulation, planSample } from "./support/samples";
import * as evidenceList from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/[itemId]/evidence/route";
import * as notes from "@/app/api/engagements/[engagementId]/samples/[sampleId]/notes/route";
import * as teamLists from "@/app/api/engagements/[engagementId]/samples/[sampleId]/requests/route";
import * as clientList from "@/app/api/requests/[listId]/route";
import * as clientFiles from "@/app/api/requests/[listId]/items/[requestItemId]/files/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

const API = path.join(import.meta.dirname, "../../app/api");
const METHODS = ["GET", "HEAD", "POST", "PUT", "PATCH", "DELETE"] as const;
const PDF = new TextEncoder().encode("%PDF-1.7\n%%EOF\n"); // ISO 32000-1:2008 §7.5.2 header

/** Routes outside an engagement, with what a client contact gets from each. */
const CLIENT_ROWS: Record<string, number | "skip"> = {
  "GET /api/auth/[...nextauth]": "skip", // next-auth's own sign-in handler, not ours: sign-in is tested in e2e
  "POST /api/auth/[...nextauth]": "skip",
  "GET /api/me": 200, // their own profile only
  "GET /api/me/inbox": 403, // the review inbox is the audit team's (issue 19)
  "GET /api/engagements": 200, // an empty list: a client contact is on no audit team (asserted below)
  "POST /api/engagements": 403,
  "GET /api/users": 403, // the firm's people are not for client staff
  "POST /api/users": 403,
  "PATCH /api/users/[userId]": 403,
  "POST /api/users/[userId]/password": 403,
  "GET /api/firm/methodology": 403, // firm administrators only
  "PUT /api/firm/methodology": 403,
  "GET /api/firm/mail-outbox": 403, // firm admins only
  "GET /api/health": 200, // the load balancer's check, public
  "GET /api/requests": 200,
  "GET /api/requests/[listId]": 200,
  "PATCH /api/requests/[listId]/items/[requestItemId]": 204,
  "POST /api/requests/[listId]/items/[requestItemId]/files": 201,
  "GET /api/requests/[listId]/files/[fileId]": 200,
  "POST /api/invitations/[token]": 404, // public; an unknown link
};

function routeFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const full = path.join(dir, e.name);
    return e.isDirectory() ? routeFiles(full) : e.name === "route.ts" ? [full] : [];
  });
}

let client: number, engagement: number;
const ids: Record<string, string> = {};

beforeAll(async () => {
  const firm = await makeFirm();
  const [manager, senior, staff] = await Promise.all([
    makeUser(firm, "manager"),
    makeUser(firm, "senior"),
    makeUser(firm, "staff"),
  ]);
  client = await makeUser(firm, "client");
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
    [staff, "staff"],
    [client, "client"],
  ]);
  const { populationId } = await loadCanonicalPopulation(senior, engagement);
  const sampleId = (
    await planSample(senior, engagement, {
      populationId,
      params: {
        method: "random",
        estimator: "difference",
        tolerableMisstatement: "5000",
        sampleSize: 4,
        sizeReason: "test",
      },
    })
  ).json.sample.id;
  await drawSample(senior, engagement, sampleId, 11);
  const items = await listSampleItems(senior, engagement, sampleId);
  const e = { engagementId: String(engagement), sampleId: String(sampleId) };
  const evidence = await call(evidenceList.POST, "POST", {
    as: staff,
    params: { ...e, itemId: String(items[0].id) },
    query: { fileName: "a.pdf" },
    file: PDF,
  });
  const note = await call(notes.POST, "POST", { as: manager, params: e, body: { text: "Check the cut-off" } });
  const pending = await upload(senior, engagement, "pending.csv", "id,book_value\nA,1.00\n");
  const list = await call(teamLists.POST, "POST", {
    as: senior,
    params: e,
    body: { title: "Docs", contactUserId: client, dueDate: "2099-01-01", needs: ["invoice"], items: "all" },
  });
  const listId = String(list.json.requestList.id);
  const requestItemId = String(
    (await call(clientList.GET, "GET", { as: client, params: { listId } })).json.items[0].id,
  );
  const file = await call(clientFiles.POST, "POST", {
    as: client,
    params: { listId, requestItemId },
    query: { fileName: "inv.pdf" },
    file: PDF,
  });
  Object.assign(ids, {
    ...e,
    populationId: String(populationId),
    itemId: String(items[0].id),
    evidenceId: String(evidence.json.evidence.id),
    noteId: String(note.json.notes[0].id),
    uploadId: String(pending.json.upload.id),
    userId: String(senior),
    listId,
    requestItemId,
    fileId: String(file.json.file.id),
    token: "an-unknown-invitation-link-0000",
  });
});

afterAll(async () => {
  await getDb().destroy();
});

const routes = routeFiles(API)
  .map((file) => ({ file, url: "/api/" + path.relative(API, path.dirname(file)).split(path.sep).join("/") }))
  .sort((a, b) => a.url.localeCompare(b.url));

describe("a client contact against every route handler", () => {
  it("finds the route files, and every row of the table names a handler that exists", async () => {
    expect(routes.length).toBeGreaterThan(40);
    for (const key of Object.keys(CLIENT_ROWS)) {
      const [method, url] = key.split(" ");
      const route = routes.find((r) => r.url === url);
      expect(route, `${key}: no such route file`).toBeDefined();
      expect(typeof ((await import(route!.file)) as Record<string, unknown>)[method], `${key}: no such handler`).toBe(
        "function",
      );
    }
  });

  for (const { file, url } of routes) {
    it(`${url}`, async () => {
      const mod = (await import(file)) as Record<string, unknown>;
      const methods = METHODS.filter((m) => typeof mod[m] === "function");
      expect(methods.length, `${url} exports no handler`).toBeGreaterThan(0);
      for (const method of methods) {
        const key = `${method} ${url}`;
        const expected = url.startsWith("/api/engagements/[engagementId]") ? 404 : CLIENT_ROWS[key];
        expect(expected, `${key} has no row in the client matrix: add one`).toBeDefined();
        if (expected === "skip") continue;
        const params = Object.fromEntries(
          [...url.matchAll(/\[([^\]]+)\]/g)].map(([, name]) => [name, ids[name] ?? "1"]),
        );
        const handler = mod[method] as Parameters<typeof callRaw>[0];
        const isUpload = method === "POST" && /\/files$|\/uploads$|\/evidence$|\/original$|\/workbook$/.test(url);
        const res = await callRaw(handler, method, {
          as: client,
          params,
          ...(method === "GET" || method === "HEAD" || method === "DELETE"
            ? {}
            : isUpload
              ? { query: { fileName: "x.pdf" }, file: PDF }
              : {
                  body:
                    method === "PATCH" && url.startsWith("/api/requests")
                      ? { note: "A note" }
                      : { password: "a-long-enough-password" },
                }),
        });
        const text = await res.text();
        expect({ key, status: res.status }, text.slice(0, 300)).toEqual({ key, status: expected });
        if (key === "GET /api/engagements") expect(JSON.parse(text).engagements).toEqual([]);
        if (expected === 404 && url.startsWith("/api/engagements"))
          expect(text).not.toMatch(/INV0\d\d|Check the cut-off|book_?value/i);
      }
    });
  }
});

describe("page guards", () => {
  it("show a client contact not-found on the engagement's pages and send them from the workspace to their requests", async () => {
    actAs(client);
    await expect(requireEngagementPage(String(engagement))).rejects.toMatchObject({
      digest: expect.stringContaining("404"),
    });
    await expect(requireWorkspaceUser()).rejects.toMatchObject({ digest: expect.stringContaining("/requests") });
  });
});
