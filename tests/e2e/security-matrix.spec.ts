import { expect, test } from "@playwright/test";
import { discoverRouteHandlers, discoverServerActions } from "./security/discover-routes";
import { buildMatrixFixtures, type MatrixFixtures } from "./security/matrix-fixtures";
import { ACTION_MATRIX, ACTORS, REFUSED, ROUTE_MATRIX, type Actor, type MatrixRow } from "./security/route-matrix";

test.describe.configure({ mode: "serial" });

let fx: MatrixFixtures;

test.beforeAll(async ({ baseURL }) => {
  test.setTimeout(120_000);
  fx = await buildMatrixFixtures(baseURL!);
});

function fillPath(pattern: string, ids: Record<string, number | string>): string {
  return pattern.replace(/\[(\w+)\]/g, (_m, name: string) => {
    if (ids[name] === undefined) throw new Error(`no fixture id for [${name}] in ${pattern}`);
    return String(ids[name]);
  });
}

async function probe(
  row: MatrixRow,
  actor: Actor,
  ids: Record<string, number | string>,
  body?: string,
): Promise<{ status: number; text: string }> {
  const [method, pattern] = row.route.split(" ");
  const url = fillPath(row.probe?.path ?? pattern, ids) + (row.probe?.query ? `?${row.probe.query}` : "");
  const sendsBody = method !== "GET" && method !== "DELETE";
  const res = await fx.sessions[actor].fetch(url, {
    method,
    headers: sendsBody ? { "content-type": row.probe?.contentType ?? "application/json" } : {},
    body: sendsBody ? (body ?? row.probe?.body ?? REFUSED) : undefined,
  });
  return { status: res.status, text: await res.text() };
}

/** What a reviewer sees of the matrix engagement: if a probe wrote anything, one of these changes. */
async function snapshot(): Promise<string> {
  const { engagementId: e, sampleId: s, populationId: p, itemId: i } = fx.ids;
  const reads = [
    `/api/engagements/${e}`,
    `/api/engagements/${e}/members`,
    `/api/engagements/${e}/populations`,
    `/api/engagements/${e}/samples`,
    `/api/engagements/${e}/samples/${s}`,
    `/api/engagements/${e}/samples/${s}/items?pageSize=500`,
    `/api/engagements/${e}/samples/${s}/notes`,
    `/api/engagements/${e}/samples/${s}/items/${i}/evidence?includeDeleted=true`,
    `/api/engagements/${e}/populations/${p}`,
    "/api/users",
  ];
  const bodies = await Promise.all(reads.map((r) => fx.sessions.partner.json(r)));
  return JSON.stringify(bodies);
}

test("every route handler and server action has a row in the matrix", () => {
  const routes = discoverRouteHandlers();
  const rows = ROUTE_MATRIX.map((r) => r.route).sort();
  expect(routes.length).toBeGreaterThan(40);
  expect(
    routes.filter((r) => !rows.includes(r)),
    "routes without a row in tests/e2e/security/route-matrix.ts",
  ).toEqual([]);
  expect(
    rows.filter((r) => !routes.includes(r)),
    "rows naming no route",
  ).toEqual([]);
  expect(new Set(rows).size, "one row per route").toBe(rows.length);
  expect(discoverServerActions()).toEqual(ACTION_MATRIX.map((a) => a.action).sort());
  for (const row of ROUTE_MATRIX) expect(Object.keys(row.expect).sort(), row.route).toEqual([...ACTORS].sort());
});

test("every caller gets the expected status from every route, and no probe writes anything", async () => {
  test.setTimeout(300_000);
  const before = await snapshot();
  const mismatches: string[] = [];
  const table: string[] = [`| route | ${ACTORS.join(" | ")} |`, `| --- |${ACTORS.map(() => " --- |").join("")}`];
  for (const row of ROUTE_MATRIX) {
    const cells: string[] = [];
    for (const actor of ACTORS) {
      const { status, text } = await probe(row, actor, fx.ids);
      cells.push(String(status));
      if (status !== row.expect[actor])
        mismatches.push(`${row.route} as ${actor}: expected ${row.expect[actor]}, got ${status} ${text.slice(0, 200)}`);
      // A member who passes the engagement check must never get the engagement-level 404.
      if (
        status === 404 &&
        ["viewer", "staff", "senior", "manager", "partner"].includes(actor) &&
        text.includes("No such engagement")
      ) {
        mismatches.push(`${row.route} as ${actor}: a member got "No such engagement"`);
      }
      if (status >= 400)
        expect(text, `${row.route} as ${actor}: error bodies carry no stack or SQL`).not.toMatch(
          /\bat \S+ \(|node_modules|\bSELECT\b|\bINSERT\b|ER_[A-Z_]+/,
        );
    }
    table.push(`| ${row.route} | ${cells.join(" | ")} |`);
  }
  await test.info().attach("authorisation-matrix.md", { body: table.join("\n"), contentType: "text/markdown" });
  console.log(
    `authorisation matrix: ${ROUTE_MATRIX.length} routes × ${ACTORS.length} callers = ${ROUTE_MATRIX.length * ACTORS.length} cells`,
  );
  expect(mismatches).toEqual([]);
  expect(await snapshot(), "the probes changed nothing on the engagement").toBe(before);
});

// Ids of the matrix engagement's population, upload, sample, item, evidence and note, sent under
// another engagement's path by someone who is partner there: the record must not be found.
for (const scope of ["another engagement of the same firm", "an engagement of another firm"] as const) {
  test(`ids from the matrix engagement used through ${scope} always answer 404`, async () => {
    test.setTimeout(120_000);
    const actor: Actor = scope.includes("same firm") ? "partner" : "otherFirm";
    const engagementId = scope.includes("same firm") ? fx.otherEngagementId : fx.otherFirmEngagementId;
    const childParams = /\[(populationId|uploadId|sampleId|itemId|evidenceId|noteId)\]/;
    const rows = ROUTE_MATRIX.filter((r) => childParams.test(r.route) && !r.probe?.path);
    expect(rows.length).toBeGreaterThan(25);
    const leaks: string[] = [];
    for (const row of rows) {
      const method = row.route.split(" ")[0];
      const body =
        method === "GET" || method === "DELETE"
          ? undefined
          : row.validBody
            ? JSON.stringify(row.validBody(fx.ids))
            : undefined;
      // Streaming uploads take their input from the query: give them a valid file name.
      const valid = row.validBody
        ? undefined
        : row.probe?.query
          ? { ...row.probe, query: "fileName=cross-probe.txt" }
          : row.probe;
      const { status, text } = await probe({ ...row, probe: valid }, actor, { ...fx.ids, engagementId }, body);
      if (status !== 404) leaks.push(`${row.route}: ${status} ${text.slice(0, 200)}`);
    }
    expect(leaks).toEqual([]);
  });
}

test("a firm administrator cannot reach another firm's people by id", async () => {
  const staffId = fx.ids.userId;
  const headers = { "content-type": "application/json" };
  const patch = await fx.sessions.otherFirm.fetch(`/api/users/${staffId}`, {
    method: "PATCH",
    headers,
    body: JSON.stringify({ name: "Renamed by another firm" }),
  });
  expect(patch.status).toBe(404);
  const reset = await fx.sessions.otherFirm.fetch(`/api/users/${staffId}/password`, {
    method: "POST",
    headers,
    body: JSON.stringify({ password: "another-firm-took-this-1" }),
  });
  expect(reset.status).toBe(404);
  const { users } = await fx.sessions.otherFirm.json<{ users: { email: string }[] }>("/api/users");
  expect(users.map((u) => u.email)).toEqual(["partner@larkspur-audit.example"]);
});
