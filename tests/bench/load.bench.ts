/**
 * Load and fault benchmark: `npm run bench:load` (figures printed; no timed assertions).
 *
 * Against the built app (`next start` on 127.0.0.1:3240, its own storage and mail fakes, and a
 * MariaDB server of its own under .data/mariadb-load on port 4849, database sondage_load):
 *  1. Saves. (a) Closed loop, saturation: 50 signed-in staff save audited values on one sample as
 *     fast as answers come for 30 s (autocannon), beside (b) the same closed loop against a bare
 *     Node handler doing the same single-row transaction without session and audit work
 *     (load/bare-save-server.ts), printed as ratios ours / bare. (c) Open loop, as people work:
 *     50 users each saving at Poisson arrivals averaging one save per 2 s for 60 s. Every
 *     acknowledged save is checked in the database. Goal for (c): p95 ≤ 100 ms, 0 errors, 0 lost.
 *  2. 50 users page the items of a 1,000,000-row population by key (after= cursors, from random
 *     starting points, sorts row/ref/book both ways) for 20 s. Goal: 0 × 503, p95 ≤ 300 ms. And one
 *     user's first page against a deep one (by cursor and by the old page-number offset).
 *  3. Faults: the database SIGKILLed during a population import and during a burst of saves (503
 *     with a message, reconnect, no partial population, acknowledged saves kept); the app SIGKILLed
 *     and restarted in the middle of an import (the import complete or absent).
 *     Beside it, the same users and the same walk against a bare Node handler running only the
 *     keyset query (load/bare-page-server.ts), measured in the same run: printed as ours / bare.
 * LOAD_SAVE_S / LOAD_PAGE_S shorten the runs; NEXT_DIST_DIR picks the build (default .next-load).
 * LOAD_ONLY=paging runs only part 2; LOAD_KEEP_DB=1 keeps the bench database of the previous run
 * (its users and its 1,000,000-row population; migrations still run), so a paging run takes about a minute;
 * LOAD_APP_NODE_ARGS passes Node options to the app server alone (a CPU profile: "--cpu-prof --cpu-prof-dir=…").
 */
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { cpus, loadavg } from "node:os";
import path from "node:path";
import knex, { type Knex } from "knex";
import { loadLocalEnv } from "../../db/load-env";
import { buildKnexConfig } from "../../db/knex-config";
import { HttpSession } from "./support/http-session";
import { ROOT, run, startService, stopService, waitForHttp, type Service } from "./support/processes";
import { PrivateMariaDb } from "./support/private-db";
import { fmt, hammer } from "./load/measure";
import { SaveTracker, verifySaves } from "./load/saves";
import { addLoadUsers, drawSample, LOAD_PASSWORD, sampleItems, signInAll, uploadLedger } from "./load/fixtures";
import { burstWithKill, maxPopulationId, populationsSince, startLoad, until } from "./load/faults";
import { openLoop } from "./load/open-loop";
import { encodeCursor } from "../../lib/validation/keyset";

loadLocalEnv();
const PORTS = { app: 3240, s3: 4840, smtp: 2840, inbox: 2841, db: 4849, bare: 3241, barePage: 3242 };
const APP = `http://127.0.0.1:${PORTS.app}`;
const DIST = process.env.NEXT_DIST_DIR ?? ".next-load";
const DB_NAME = "sondage_load";
const SAVE_S = Number(process.env.LOAD_SAVE_S ?? 30);
const PAGE_S = Number(process.env.LOAD_PAGE_S ?? 20);
const OPEN_S = Number(process.env.LOAD_OPEN_S ?? 60);
const USERS = 50;
const ONLY_PAGING = process.env.LOAD_ONLY === "paging";
const KEEP_DB = process.env.LOAD_KEEP_DB === "1";
/** Node options for the app server only, e.g. LOAD_APP_NODE_ARGS="--cpu-prof --cpu-prof-dir=/tmp/prof" to see where its time goes. */
const NODE_ARGS = (process.env.LOAD_APP_NODE_ARGS ?? "").split(" ").filter(Boolean);
const SENIOR = "senior@marrow-quill.example";
const LOG = path.join(ROOT, ".data/load-bench.log");
const log = (line: string) => console.log(`[load bench] ${line}`);
const figures: string[] = [];
const report = (line: string) => {
  figures.push(line);
  log(line);
};

const env = (): NodeJS.ProcessEnv => ({
  ...process.env,
  DB_HOST: "127.0.0.1",
  DB_PORT: String(PORTS.db),
  DB_NAME,
  NEXTAUTH_URL: APP,
  NEXT_DIST_DIR: DIST,
  S3_ENDPOINT: `http://127.0.0.1:${PORTS.s3}`,
  S3_BUCKET: "sondage-load",
  SMTP_HOST: "127.0.0.1",
  SMTP_PORT: String(PORTS.smtp),
  MAIL_INBOX_PORT: String(PORTS.inbox),
  UPLOAD_DIR: ".data/uploads-load",
  FAKES_DATA: "fakes-load",
  NEXT_TELEMETRY_DISABLED: "1",
});
const database = (): Knex => knex(buildKnexConfig(env()));

async function startAppServer(): Promise<Service> {
  const server = startService(
    "next start",
    process.execPath,
    [...NODE_ARGS, "node_modules/next/dist/bin/next", "start", "-H", "127.0.0.1", "-p", String(PORTS.app)],
    env(),
    LOG,
  );
  await waitForHttp(`${APP}/api/auth/csrf`, server);
  return server;
}

async function hardKill(service: Service): Promise<void> {
  try {
    process.kill(-service.pid, "SIGKILL");
  } catch {
    /* gone */
  }
  await service.exited;
}

async function addUsers(engagementId: number): Promise<string[]> {
  const db = database();
  try {
    const kept = await db("users").where("email", "like", "load%@marrow-quill.example").orderBy("id").pluck("email");
    if (kept.length >= USERS) return kept.slice(0, USERS);
    return await addLoadUsers(db, engagementId, USERS);
  } finally {
    await db.destroy();
  }
}

const loadFile = (senior: HttpSession, base: string, rows: number, name: string) =>
  uploadLedger(senior, base, rows, name, log);

async function loadPopulation(
  senior: HttpSession,
  base: string,
  rows: number,
  name: string,
  attempt = 1,
): Promise<number> {
  const { uploadId } = await loadFile(senior, base, rows, name);
  const { done } = startLoad(senior, base, uploadId, name);
  const result = await done;
  if (result.last?.type !== "loaded") {
    if (attempt >= 2) throw new Error(`load of ${rows} rows: ${JSON.stringify(result)}`);
    report(
      `NOTE: the load of ${rows.toLocaleString("en-US")} rows failed once (${JSON.stringify(result.last ?? result.error)}); loading it again`,
    );
    return loadPopulation(senior, base, rows, name, attempt + 1);
  }
  const populationId = result.last.populationId!;
  const pop = await senior.json<{ population: { total: string; rowCount: number } }>(
    `${base}/populations/${populationId}`,
  );
  await senior.json(`${base}/populations/${populationId}/reconciliation`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ controlTotal: pop.population.total, controlCount: pop.population.rowCount }),
  });
  log(`loaded ${rows.toLocaleString("en-US")} rows in ${(result.ms / 1000).toFixed(1)} s (population ${populationId})`);
  return populationId;
}

/** One credentials sign-in try; the error text next-auth passes back in the redirect, or "ok". */
async function trySignIn(
  email: string,
  password: string,
  headers: Record<string, string> = {},
): Promise<{ ok: boolean; error: string; ms: number }> {
  const s = new HttpSession(APP);
  const { csrfToken } = await s.json<{ csrfToken: string }>("/api/auth/csrf");
  const started = performance.now();
  const res = await s.fetch("/api/auth/callback/credentials", {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded", ...headers },
    body: new URLSearchParams({ csrfToken, email, password, json: "true" }).toString(),
  });
  const ms = performance.now() - started;
  const location = res.headers.get("location") ?? (await res.text());
  const error = decodeURIComponent(/error=([^&"]+)/.exec(location)?.[1] ?? "").replace(/\+/g, " ");
  return { ok: !error, error, ms };
}

async function measureSignInThrottle(emails: string[]) {
  const target = emails.at(-1)!;
  const tries = [];
  for (let i = 0; i < 7; i++) tries.push(await trySignIn(target, "wrong-password-" + i));
  const right = await trySignIn(target, LOAD_PASSWORD);
  const firstBlocked = tries.findIndex((t) => /Too many/.test(t.error)) + 1;
  report(
    `sign-in throttle, one account: failures answered "${tries[0].error}" in ${tries[0].ms.toFixed(0)} ms each (bcrypt); try ${firstBlocked} was refused: "${tries[firstBlocked - 1]?.error}"; the right password then: ${right.ok ? "accepted (NOT throttled)" : `refused ("${right.error}")`}`,
  );
  // The per-address limit (20 in 15 min) keys on X-Forwarded-For: from one address it holds; a caller who sets the header freely gets a fresh bucket each time.
  const sameAddress = [];
  for (let i = 0; i < 21; i++)
    sameAddress.push(await trySignIn(`nobody${i}@nowhere.example`, "x", { "x-forwarded-for": "198.51.100.7" }));
  const ipBlocked = sameAddress.findIndex((t) => /network address/.test(t.error)) + 1;
  const spoofed = [];
  for (let i = 0; i < 21; i++)
    spoofed.push(await trySignIn(`ghost${i}@nowhere.example`, "x", { "x-forwarded-for": `203.0.113.${i}` }));
  report(
    `sign-in throttle, one address: try ${ipBlocked || "none"} of 21 refused for the address; with a new X-Forwarded-For per try: ${spoofed.filter((t) => /network address/.test(t.error)).length} of 21 refused (the per-address limit needs a proxy that overwrites the header; the per-account limit holds regardless)`,
  );
}

/** A cursor at a random place of the generated ledger (rows 2…1,000,001, refs INV-/CN-100001…, amounts mostly 50–5,000). */
function randomCursor(sort: "row" | "ref" | "book"): string {
  const row = 2 + Math.floor(Math.random() * 1_000_000);
  if (sort === "row") return encodeCursor({ value: row, key: row });
  if (sort === "ref") return encodeCursor({ value: `INV-${100000 + row - 1}`, key: 0 });
  return encodeCursor({ value: Math.exp(4 + 6 * Math.random()).toFixed(2), key: 0 });
}

/** One user, one request at a time: the first page, a deep page by cursor, and the same deep page by the old page-number offset. */
async function comparePageDepths(session: HttpSession, itemsUrl: string) {
  const time = async (query: string) => {
    const ms: number[] = [];
    for (let i = 0; i < 15; i++) {
      const started = performance.now();
      const res = await session.fetch(`${itemsUrl}?${query}`);
      await res.text();
      ms.push(performance.now() - started);
    }
    return ms.sort((a, b) => a - b)[7];
  };
  const first = await time("sort=ref&pageSize=50");
  const deepCursor = await time(`sort=ref&pageSize=50&after=${encodeCursor({ value: "INV-1000000", key: 0 })}`);
  const deepOffset = await time("sort=ref&pageSize=50&page=18000");
  report(
    `one user, median of 15, sort by reference: first page ${first.toFixed(1)} ms; page ~18,000 by cursor ${deepCursor.toFixed(1)} ms (${(deepCursor / first).toFixed(2)}× the first); the same depth by page number (OFFSET) ${deepOffset.toFixed(1)} ms (${(deepOffset / first).toFixed(2)}×)`,
  );
}

/** The 1,000,000-row population a previous run loaded into the bench database, or null. */
async function keptMillionPopulation(): Promise<number | null> {
  const db = database();
  try {
    const row = await db("populations")
      .where({ row_count: 1_000_000 })
      .whereNot({ status: "loading" })
      .max({ id: "id" })
      .first();
    return row?.id ? Number(row.id) : null;
  } catch {
    return null;
  } finally {
    await db.destroy();
  }
}

let nextUser = 0;

/**
 * The paging walk: each of the 50 connections reads a run of up to 10 pages from a random place (a
 * jump, as a search or a sort lands somewhere deep), following nextCursor; then jumps again.
 */
function pagingWalk(
  pathOf: (query: string, after: string) => string,
  headersOf: (ctx: Record<string, unknown>) => Record<string, string>,
) {
  return {
    setup: (ctx: Record<string, unknown>) => {
      if (!ctx.next || (ctx.run as number) >= 10) {
        const sort = (["row", "ref", "book"] as const)[Math.floor(Math.random() * 3)];
        ctx.query = `sort=${sort}&dir=${Math.random() < 0.5 ? "asc" : "desc"}&pageSize=50`;
        ctx.next = randomCursor(sort);
        ctx.run = 0;
      }
      ctx.run = (ctx.run as number) + 1;
      return { path: pathOf(ctx.query as string, ctx.next as string), headers: headersOf(ctx) };
    },
    onAnswer: (status: number, body: string, ctx: Record<string, unknown>) => {
      ctx.next =
        status === 200 ? ((JSON.parse(body) as { nextCursor: string | null }).nextCursor ?? undefined) : undefined;
    },
  };
}

async function measurePaging(senior: HttpSession, base: string, sessions: HttpSession[], services: Service[]) {
  const bigPopulation =
    (KEEP_DB ? await keptMillionPopulation() : null) ??
    (await loadPopulation(senior, base, 1_000_000, "load-ledger-1m"));
  const itemsUrl = `${base}/populations/${bigPopulation}/items`;
  await comparePageDepths(senior, itemsUrl);
  const bare = startService(
    "bare page handler",
    path.join(ROOT, "node_modules/.bin/tsx"),
    ["--conditions=react-server", "tests/bench/load/bare-page-server.ts", String(PORTS.barePage)],
    env(),
    LOG,
  );
  services.push(bare);
  await waitForHttp(`http://127.0.0.1:${PORTS.barePage}/health`, bare);
  const barePaging = await hammer({
    url: `http://127.0.0.1:${PORTS.barePage}`,
    connections: USERS,
    durationS: PAGE_S,
    ok: (s) => s === 200,
    ...pagingWalk(
      (query, after) => `/populations/${bigPopulation}/items?${query}&after=${after}`,
      () => ({}),
    ),
  });
  await stopService(bare);
  services.splice(services.indexOf(bare), 1);
  const load1 = loadavg()[0];
  const paging = await hammer({
    url: APP,
    connections: USERS,
    durationS: PAGE_S,
    ok: (s) => s === 200,
    ...pagingWalk(
      (query, after) => `${itemsUrl}?${query}&after=${after}`,
      (ctx) => {
        ctx.cookie ??= sessions[nextUser++ % sessions.length].cookieHeader();
        return { cookie: ctx.cookie as string };
      },
    ),
  });
  report(
    `paging by key, bare keyset handler (reference, same run), ${USERS} connections × ${PAGE_S} s, same walk: ${fmt(barePaging)}`,
  );
  report(
    `paging by key, ${USERS} users × ${PAGE_S} s over 1,000,000 items (runs of 10 pages from random places, sort row/ref/book, asc/desc): ${fmt(paging)}; goal 0 × 503 and p95 ≤ 300 ms → ${(paging.statuses["503"] ?? 0) === 0 && paging.p95 <= 300 ? "met" : "NOT met"}`,
  );
  report(
    `paging ours / bare: throughput ${(paging.rps / barePaging.rps).toFixed(2)}× (${paging.rps.toFixed(0)} vs ${barePaging.rps.toFixed(0)} req/s), p95 ${(paging.p95 / barePaging.p95).toFixed(2)}× (${paging.p95.toFixed(0)} vs ${barePaging.p95.toFixed(0)} ms), p50 ${(paging.p50 / barePaging.p50).toFixed(2)}×; load average ${load1.toFixed(2)} → ${loadavg()[0].toFixed(2)} (1 min) on ${cpus().length} cores`,
  );
  // As people page: each of the 50 users asks for the next page on average once a second (Poisson
  // arrivals, open loop: whether or not the last page has come), following the same walk.
  const walk = pagingWalk(
    (query, after) => `${itemsUrl}?${query}&after=${after}`,
    () => ({}),
  );
  const walks = Array.from({ length: USERS }, () => ({}));
  const people = await openLoop({
    users: USERS,
    meanGapMs: 1_000,
    durationMs: PAGE_S * 1000,
    send: async (u) => {
      const { path: pagePath } = walk.setup(walks[u]);
      const res = await fetch(`${APP}${pagePath}`, {
        headers: { cookie: sessions[u % sessions.length].cookieHeader() },
      });
      walk.onAnswer(res.status, await res.text(), walks[u]);
      return res.status;
    },
  });
  report(
    `paging as people page (open loop: ${USERS} users × one page a second on average, Poisson, ${PAGE_S} s): ${people.sent} sent, ${people.answered} answered, p50 ${people.p50.toFixed(0)} ms · p95 ${people.p95.toFixed(0)} ms · p99 ${people.p99.toFixed(0)} ms, statuses ${JSON.stringify(people.statuses)}, transport errors ${people.transportErrors}; goal 0 × 503 and p95 ≤ 300 ms → ${(people.statuses["503"] ?? 0) === 0 && people.transportErrors === 0 && people.p95 <= 300 ? "met" : "NOT met"}`,
  );
  if (ONLY_PAGING) return;
  // The queries autocannon left behind keep the pool busy for a while: wait until a write gets a connection again.
  const drained = await until(senior, `${base}/populations`, 200, 120_000);
  await new Promise((r) => setTimeout(r, 15_000));
  log(`after paging, the app answered again within ${drained.ms.toFixed(0)} ms (+15 s settle)`);
}

async function main() {
  mkdirSync(path.dirname(LOG), { recursive: true });
  writeFileSync(LOG, "");
  const dbServer = new PrivateMariaDb(PORTS.db, LOG);
  const services: Service[] = [];
  let app: Service | null = null;
  try {
    if (!existsSync(path.join(ROOT, DIST, "BUILD_ID"))) {
      log(`building into ${DIST}…`);
      await run("npx", ["next", "build"], env());
      await run("git", ["checkout", "tsconfig.json"]).catch(() => undefined);
    }
    await dbServer.start();
    const kept = KEEP_DB && (await keptMillionPopulation()) !== null;
    if (!kept) await dbServer.createDatabase(DB_NAME);
    await run("npx", ["tsx", "db/migrate.ts", "latest"], env());
    if (!kept) await run("npx", ["tsx", "db/seed.ts"], env());
    else log("kept the bench database of the previous run (LOAD_KEEP_DB=1)");
    rmSync(path.join(ROOT, ".data/uploads-load"), { recursive: true, force: true });
    services.push(
      startService("fakes", path.join(ROOT, "node_modules/.bin/tsx"), ["lib/fakes/run-fakes.ts"], env(), LOG),
    );
    await waitForHttp(`http://127.0.0.1:${PORTS.s3}/`, services[0]);
    app = await startAppServer();

    const senior = new HttpSession(APP);
    await senior.signIn(SENIOR, "sondage-demo-2026");
    const { engagements } = await senior.json<{ engagements: { id: number; clientName: string }[] }>(
      "/api/engagements",
    );
    const engagementId = engagements.find((e) => e.clientName.startsWith("Tessaly"))!.id;
    const base = `/api/engagements/${engagementId}`;
    const emails = await addUsers(engagementId);
    const sessions = await signInAll(APP, emails);
    log(`${sessions.length} staff signed in`);

    if (ONLY_PAGING) {
      await measurePaging(senior, base, sessions, services);
      return;
    }

    // 0. Sign-in throttling, measured.
    await measureSignInThrottle(emails);

    // 1. Saves on one sample.
    const smallPopulation = await loadPopulation(senior, base, 5_000, "load-ledger-5k");
    const sampleId = await drawSample(senior, base, smallPopulation, 100);
    const items = await sampleItems(senior, base, sampleId);
    const tracker = new SaveTracker(items);
    const saves = await hammer({
      url: APP,
      connections: USERS,
      durationS: SAVE_S,
      ok: (s) => s === 200 || s === 409,
      setup: (ctx) => {
        ctx.cookie ??= sessions[nextUser++ % sessions.length].cookieHeader();
        const save = tracker.next();
        ctx.save = save;
        return {
          method: "PATCH",
          path: `${base}/samples/${sampleId}/items/${save.itemId}`,
          headers: { cookie: ctx.cookie as string, "content-type": "application/json" },
          body: save.body,
        };
      },
      onAnswer: (status, body, ctx) => tracker.answer(status, body, ctx.save as { itemId: number; value: string }),
    });
    const db1 = database();
    const checked = await verifySaves(db1, {
      sampleId,
      initial: new Map(items.map((i) => [i.id, i.version])),
      acks: tracker.ledger.acks,
    }).finally(() => db1.destroy());
    report(`saves, ${USERS} users × ${SAVE_S} s on one sample of ${items.length} items: ${fmt(saves)}`);
    report(
      `saves verified: ${checked.acked} acknowledged (200), ${tracker.ledger.conflicts} conflicts (409), lost ${checked.lost}, duplicate versions ${checked.duplicateVersions}, wrong final values ${checked.wrongFinal}, audit rows ${checked.auditRows}`,
    );

    // 1b. The same closed loop against a bare handler doing the same single-row transaction.
    const bare = startService(
      "bare save handler",
      path.join(ROOT, "node_modules/.bin/tsx"),
      ["tests/bench/load/bare-save-server.ts", String(PORTS.bare)],
      env(),
      LOG,
    );
    services.push(bare);
    await waitForHttp(`http://127.0.0.1:${PORTS.bare}/health`, bare);
    const bareItems = await sampleItems(senior, base, sampleId);
    const bareTracker = new SaveTracker(bareItems);
    const bareSaves = await hammer({
      url: `http://127.0.0.1:${PORTS.bare}`,
      connections: USERS,
      durationS: SAVE_S,
      ok: (s) => s === 200 || s === 409,
      setup: (ctx) => {
        const save = bareTracker.next();
        ctx.save = save;
        return {
          method: "PATCH",
          path: `/items/${save.itemId}`,
          headers: { "content-type": "application/json" },
          body: save.body,
        };
      },
      onAnswer: (status, body, ctx) => bareTracker.answer(status, body, ctx.save as { itemId: number; value: string }),
    });
    await stopService(bare);
    services.splice(services.indexOf(bare), 1);
    report(`bare handler, same closed loop (${USERS} connections × ${SAVE_S} s, same items): ${fmt(bareSaves)}`);
    report(
      `saturation ours / bare: throughput ${(saves.rps / bareSaves.rps).toFixed(2)}× (${saves.rps.toFixed(0)} vs ${bareSaves.rps.toFixed(0)} req/s), p95 ${(saves.p95 / bareSaves.p95).toFixed(2)}× (${saves.p95.toFixed(0)} vs ${bareSaves.p95.toFixed(0)} ms), p50 ${(saves.p50 / bareSaves.p50).toFixed(2)}×`,
    );

    // 1c. Open loop: people saving at their own pace, each on items of their own.
    const openSample = await drawSample(senior, base, smallPopulation, 200);
    const openItems = await sampleItems(senior, base, openSample);
    const perUser = Math.floor(openItems.length / USERS);
    const versions = new Map(openItems.map((i) => [i.id, i.version]));
    const inFlight = new Set<number>();
    const openAcks: { itemId: number; version: number; value: string }[] = [];
    let saveNo = 0,
      openConflicts = 0;
    const open = await openLoop({
      users: USERS,
      meanGapMs: 2_000,
      durationMs: OPEN_S * 1000,
      send: async (u) => {
        const mine = openItems
          .slice(u * perUser, (u + 1) * perUser)
          .map((i) => i.id)
          .filter((id) => !inFlight.has(id));
        const itemId = mine[Math.floor(Math.random() * mine.length)] ?? openItems[u * perUser].id;
        const n = ++saveNo;
        const value = `${2000 + Math.floor(n / 100)}.${String(n % 100).padStart(2, "0")}`;
        inFlight.add(itemId);
        try {
          const res = await fetch(`${APP}${base}/samples/${openSample}/items/${itemId}`, {
            method: "PATCH",
            headers: { cookie: sessions[u].cookieHeader(), "content-type": "application/json" },
            body: JSON.stringify({
              version: versions.get(itemId),
              status: "done",
              auditedValue: value,
              comment: `open-loop save ${n}`,
            }),
          });
          const text = await res.text();
          if (res.status === 200) {
            const version = Number((JSON.parse(text) as { item: { version: number } }).item.version);
            openAcks.push({ itemId, version, value });
            versions.set(itemId, Math.max(version, versions.get(itemId) ?? 0));
          } else if (res.status === 409) openConflicts++;
          return res.status;
        } finally {
          inFlight.delete(itemId);
        }
      },
    });
    const db2 = database();
    const openChecked = await verifySaves(db2, {
      sampleId: openSample,
      initial: new Map(openItems.map((i) => [i.id, i.version])),
      acks: openAcks,
    }).finally(() => db2.destroy());
    const openErrors = open.sent - (open.statuses["200"] ?? 0);
    report(
      `saves, open loop: ${USERS} users × Poisson arrivals averaging one save per 2 s × ${OPEN_S} s (${(USERS / 2).toFixed(0)} saves/s offered): ${open.sent} sent, ${open.answered} answered, latency from the scheduled arrival p50 ${open.p50.toFixed(1)} ms · p95 ${open.p95.toFixed(1)} ms · p99 ${open.p99.toFixed(1)} ms · max ${open.max.toFixed(0)} ms, statuses ${JSON.stringify(open.statuses)}, transport errors ${open.transportErrors}, conflicts ${openConflicts}, late starts ${open.lateStarts}`,
    );
    report(
      `open loop verified: ${openChecked.acked} acknowledged, lost ${openChecked.lost}, duplicate versions ${openChecked.duplicateVersions}, wrong final values ${openChecked.wrongFinal}; goal p95 ≤ 100 ms, 0 errors, 0 lost → ${open.p95 <= 100 && openErrors === 0 && openChecked.lost === 0 ? "met" : "NOT met"}`,
    );

    // 2. Paging a 1,000,000-row population, beside the bare keyset reference.
    await measurePaging(senior, base, sessions, services);

    // 3a. Database killed during a population import.
    let db = database();
    const beforeMax = await maxPopulationId(db);
    await db.destroy();
    const { uploadId } = await loadFile(senior, base, 1_000_000, "load-ledger-kill-db");
    const load = startLoad(senior, base, uploadId, "Killed during import");
    await new Promise((r) => setTimeout(r, 2500));
    const phaseAtKill = load.events.at(-1)?.type;
    const killedAt = performance.now();
    await dbServer.kill();
    const outcome = await load.done;
    const probe = await until(senior, "/api/me", 503, 20_000);
    report(
      `DB killed ${2.5} s into a 1M-row import (last event then: ${phaseAtKill}): the load answered ${outcome.last?.type} ${outcome.last?.status ?? ""} "${outcome.last?.message ?? outcome.error}" ${((performance.now() - killedAt) / 1000).toFixed(1)} s after the kill; /api/me answered 503 after ${probe.ms.toFixed(0)} ms: ${probe.body.slice(0, 160)}`,
    );
    await dbServer.start();
    const back = await until(senior, "/api/me", 200, 60_000);
    db = database();
    const partial = await populationsSince(db, engagementId, beforeMax);
    await db.destroy();
    report(
      `DB restarted: the app answered 200 again after ${back.ms.toFixed(0)} ms; populations created by the killed import: ${JSON.stringify(partial)} (must be [])`,
    );

    // 3b. Database killed during a burst of saves.
    const burstItems = await sampleItems(senior, base, sampleId);
    const burst = await burstWithKill({
      sessions,
      base,
      sampleId,
      items: burstItems,
      dbServer,
      db: database,
      totalMs: 9_000,
      killAtMs: 2_500,
      restartAtMs: 5_000,
    });
    report(
      `DB killed during a burst of saves (${USERS} users, kill at 2.5 s, restart at 5.0 s, 9 s in all): ${burst.verification.acked} acknowledged, ${burst.ledger.conflicts} conflicts, ${burst.ledger.unavailable} answered 503 (first ${burst.firstUnavailableMs.toFixed(0)} ms after the kill, median ${burst.outageAnswerP50.toFixed(0)} ms each), other statuses ${JSON.stringify(burst.ledger.other)}, transport errors ${burst.networkErrors}; first 200 ${burst.firstOkAfterRestartMs.toFixed(0)} ms after the restart`,
    );
    report(
      `burst verified: lost ${burst.verification.lost}, duplicate versions ${burst.verification.duplicateVersions}, wrong final values ${burst.verification.wrongFinal}, committed but unacknowledged ${burst.verification.unacknowledgedCommits}`,
    );

    // 3c. App killed and restarted in the middle of an import.
    db = database();
    const beforeRestart = await maxPopulationId(db);
    await db.destroy();
    const other = new HttpSession(APP);
    await other.signIn("manager@marrow-quill.example", "sondage-demo-2026");
    const second = await loadFile(other, base, 1_000_000, "load-ledger-kill-app");
    const running = startLoad(other, base, second.uploadId, "App restarted during import");
    await new Promise((r) => setTimeout(r, 2500));
    const phaseAtAppKill = running.events.at(-1)?.type;
    await hardKill(app);
    const cut = await running.done;
    app = await startAppServer();
    await new Promise((r) => setTimeout(r, 2000));
    db = database();
    const afterRestart = await populationsSince(db, engagementId, beforeRestart);
    const uploadRow = await db("population_uploads").where({ id: second.uploadId }).first("status");
    await db.destroy();
    // The dead server's lease runs out (45 s): the upload is then marked failed with a message, and loads again at once.
    const killedAt2 = performance.now();
    let view: { upload: { failureMessage?: string | null } } | null = null;
    while (performance.now() - killedAt2 < 90_000) {
      view = await other.json<{ upload: { failureMessage?: string | null } }>(
        `${base}/populations/uploads/${second.uploadId}`,
      );
      if (view.upload.failureMessage) break;
      await new Promise((r) => setTimeout(r, 2_000));
    }
    const failedAfterS = (performance.now() - killedAt2) / 1000;
    const again = startLoad(other, base, second.uploadId, "Retry after restart");
    const retried = await again.done;
    report(
      `app SIGKILLed 2.5 s into a 1M-row import (last event: ${phaseAtAppKill}; the client saw ${cut.error ? "the connection cut" : cut.last?.type}); after restart, populations from it: ${JSON.stringify(afterRestart)} (complete = 1,000,000 rows, or absent); the upload's status then: ${uploadRow?.status}; marked failed ${failedAfterS.toFixed(0)} s after the restart with "${view?.upload.failureMessage ?? "(no message)"}"; loading it again: ${retried.last?.type} ${retried.last?.rowCount ?? retried.last?.message ?? ""}`,
    );
  } finally {
    if (app) await stopService(app);
    for (const s of services) await stopService(s);
    await dbServer.stop();
    const retries = (readFileSync(LOG, "utf8").match(/\[sondage\] deadlock retry/g) ?? []).length;
    figures.push(
      `transactions re-run after a deadlock / certification conflict (1213), counted in the app's log: ${retries}`,
    );
    console.log(
      `\n== bench:load figures (load average at the end: ${loadavg()
        .map((l) => l.toFixed(2))
        .join(", ")} on ${cpus().length} cores)\n` + figures.map((f) => `- ${f}`).join("\n"),
    );
  }
}

main().catch((err: unknown) => {
  console.error("[load bench] failed:", err);
  process.exit(1);
});
