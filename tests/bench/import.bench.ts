/**
 * Import benchmark: `npx tsx tests/bench/import.bench.ts [--rows 1000000] [--runs 3]`.
 *
 * Generates a ledger CSV, then against the built app (`next start` on 127.0.0.1:3200, database
 * sondage_bench, its own storage fake) times, as a signed-in senior, the upload route (HTTP
 * upload + inspection preview) and the load route (parse, validate, LOAD DATA, totals, storing
 * the original, commit) to its final `loaded` event, sampling the server's RSS every 50 ms. In the
 * same run it times the mariadb client's raw `LOAD DATA LOCAL INFILE` of the same file into a fresh
 * scratch table with population_items' columns and indexes. Verifies the loaded count and total
 * against totals computed here, and what the database holds.
 * Goals: end to end ≤ 1.5× the raw load, peak server RSS ≤ 600 MB, preview < 2 s after the upload.
 * Then the same ledger as an .xlsx workbook (support/ledger-xlsx.ts) through the same routes:
 * goal ≤ 3× the CSV's end-to-end time (median of the CSV runs), with the same count and total.
 * --xlsx-runs 0 leaves the workbook out.
 * BENCH_NODE_FLAGS="--max-semi-space-size=64" passes flags to the server's node.
 */
import { mkdirSync, mkdtempSync, rmSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { loadLocalEnv } from "../../db/load-env";
import { generateLedgerCsv } from "./generate-ledger";
import {
  APP_URL,
  BENCH,
  ROOT,
  buildIfNeeded,
  ensureDatabaseServer,
  prepareDatabase,
  startApp,
  type RunningApp,
} from "./support/bench-app";
import { HttpSession } from "./support/http-session";
import { centsToDecimal, readLedgerTotals, type LedgerTotals } from "./support/ledger-totals";
import { mariadb, rawLoad, type MariaDbClient } from "./support/raw-load";
import { cpuSeconds, mariadbPid } from "./support/cpu-time";
import { sampleMemory } from "./support/rss-sampler";
import { formatTable, median } from "./support/stats";
import { csvToXlsx } from "./support/ledger-xlsx";

const SEED = 20261202;
const SENIOR = { email: "senior@marrow-quill.example", password: "sondage-demo-2026" };
const GOALS = { ratio: 1.5, rssMb: 600, previewS: 2, xlsxToCsv: 3 };
const MAPPING = {
  itemRefColumn: "Invoice",
  bookValueColumn: "Amount",
  descriptionColumn: "Customer",
  dateColumn: "Posted",
  extraColumns: ["Due", "Currency"],
};

type LoadEvent =
  | { type: "progress"; phase: "checking" | "storing-file" | "committing" }
  | { type: "loaded"; populationId: number; rowCount: number; total: string }
  | { type: "rejected"; problemCount: number; problems: unknown[] }
  | { type: "error"; status: number; message: string };

interface Upload {
  id: number;
  sizeBytes: number;
  inspection: { headers: string[]; preview: string[][] };
}

interface RunResult {
  uploadS: number;
  previewS: number;
  loadS: number;
  checkedS: number;
  e2eS: number;
  rawS: number;
  peakRssMb: number;
  peakHwmMb: number;
  idleRssMb: number;
  /** CPU seconds during our import: the app (next start) and the database server; during the raw load: the database server. */
  appCpuS: number;
  dbCpuS: number;
  rawDbCpuS: number;
}

const log = (line: string) => console.log(`[import bench] ${line}`);

function argValue(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
}

async function findEngagementId(session: HttpSession): Promise<number> {
  const { engagements } = await session.json<{ engagements: { id: number; clientName: string }[] }>("/api/engagements");
  const tessaly = engagements.find((e) => e.clientName.startsWith("Tessaly"));
  if (!tessaly)
    throw new Error(
      `the senior is not on the Tessaly engagement (has ${engagements.map((e) => e.clientName).join(", ")})`,
    );
  return tessaly.id;
}

/** The user's path: upload (answered with the preview), then the load streamed to its outcome. */
async function uploadAndLoad(a: { session: HttpSession; engagementId: number; csv: string; run: number }) {
  const base = `/api/engagements/${a.engagementId}/populations/uploads`;
  const start = performance.now();
  const up = await a.session.uploadFile<{ upload: Upload }>(
    `${base}?fileName=${encodeURIComponent(path.basename(a.csv))}`,
    a.csv,
  );
  if (up.status !== 201) throw new Error(`upload answered ${up.status}: ${JSON.stringify(up.body).slice(0, 500)}`);
  let outcome: LoadEvent | undefined;
  let checkedMs = Number.NaN;
  const loadStart = performance.now();
  await a.session.ndjson<LoadEvent>(
    `${base}/${up.body.upload.id}/load`,
    { name: `Bench receivables, run ${a.run}`, mapping: MAPPING },
    (event, at) => {
      if (event.type === "progress" && event.phase === "storing-file" && Number.isNaN(checkedMs)) checkedMs = at;
      if (event.type !== "progress") outcome = event;
    },
  );
  const end = performance.now();
  return { up, outcome, checkedMs, loadMs: end - loadStart, e2eMs: end - start };
}

async function importThroughRoutes(a: {
  session: HttpSession;
  engagementId: number;
  csv: string;
  totals: LedgerTotals;
  app: RunningApp;
  db: MariaDbClient;
  dbPid: number;
  run: number;
}) {
  const idleRssMb = sampleMemory(a.app.server.pid).stop().peakRssMb;
  const [app0, db0] = [cpuSeconds(a.app.server.pid, a.app.fakes.pid), cpuSeconds(a.dbPid)];
  const sampler = sampleMemory(a.app.server.pid);
  const timed = await uploadAndLoad(a).catch((err: unknown) => {
    sampler.stop();
    throw err;
  });
  const mem = sampler.stop();
  const [appCpuS, dbCpuS] = [cpuSeconds(a.app.server.pid, a.app.fakes.pid) - app0, cpuSeconds(a.dbPid) - db0];
  const { up, outcome } = timed;
  const inspection = up.body.upload.inspection;
  if (inspection.preview.length !== 20) throw new Error(`the preview has ${inspection.preview.length} rows, not 20`);
  if (inspection.headers.join(",") !== a.totals.header.join(","))
    throw new Error(`the inspected headers ${inspection.headers.join(",")} differ from the file's`);
  if (outcome?.type !== "loaded")
    throw new Error(`the load did not finish with "loaded": ${JSON.stringify(outcome).slice(0, 800)}`);
  const expectedTotal = centsToDecimal(a.totals.totalCents);
  if (outcome.rowCount !== a.totals.rows || outcome.total !== expectedTotal) {
    throw new Error(
      `loaded ${outcome.rowCount} rows totalling ${outcome.total}; the file has ${a.totals.rows} rows totalling ${expectedTotal}`,
    );
  }
  const [count, sum] = (
    await mariadb(
      a.db,
      `SELECT COUNT(*), SUM(book_value) FROM population_items WHERE population_id = ${outcome.populationId}`,
    )
  )
    .trim()
    .split("\t");
  if (Number(count) !== a.totals.rows || sum !== expectedTotal)
    throw new Error(
      `population_items holds ${count} rows totalling ${sum}; expected ${a.totals.rows} and ${expectedTotal}`,
    );
  // Every stored field of every row, folded into one number: the XLSX load must store what the CSV load stores.
  const fingerprint = (
    await mariadb(
      a.db,
      `SELECT BIT_XOR(CRC32(CONCAT_WS(0x09, \`row_number\`, item_ref, IFNULL(description, ''), book_value, IFNULL(item_date, ''), IFNULL(extra, '')))) FROM population_items WHERE population_id = ${outcome.populationId}`,
    )
  ).trim();
  return {
    fingerprint,
    uploadS: up.responseMs / 1000,
    previewS: (up.responseMs - up.transferEndMs) / 1000,
    loadS: timed.loadMs / 1000,
    checkedS: timed.checkedMs / 1000,
    e2eS: timed.e2eMs / 1000,
    peakRssMb: mem.peakRssMb,
    peakHwmMb: mem.peakHwmMb,
    idleRssMb,
    appCpuS,
    dbCpuS,
  };
}

const passFail = (ok: boolean) => (ok ? "PASS" : "FAIL");

function report(results: RunResult[], rows: number, fileMb: number): boolean {
  // Each run's ratio pairs ours with the raw load timed just before it (the machine's load drifts),
  // so the summary ratio is the median of the runs' ratios, not a ratio of medians.
  const ratios = results.map((r) => r.e2eS / r.rawS);
  const line = (label: string, r: RunResult, ratio: number) => {
    return [
      label,
      rows.toLocaleString("en-US"),
      fileMb.toFixed(1),
      r.uploadS.toFixed(2),
      r.previewS.toFixed(3),
      r.loadS.toFixed(2),
      r.checkedS.toFixed(2),
      r.e2eS.toFixed(2),
      Math.round(rows / r.e2eS).toLocaleString("en-US"),
      Math.round(rows / r.rawS).toLocaleString("en-US"),
      ratio.toFixed(2),
      r.peakRssMb.toFixed(0),
      r.peakHwmMb.toFixed(0),
      `${passFail(ratio <= GOALS.ratio)} ${passFail(r.peakRssMb <= GOALS.rssMb)} ${passFail(r.previewS < GOALS.previewS)}`,
    ];
  };
  const med = (key: keyof RunResult) => median(results.map((r) => r[key]));
  const medianRun: RunResult = {
    uploadS: med("uploadS"),
    previewS: med("previewS"),
    loadS: med("loadS"),
    checkedS: med("checkedS"),
    e2eS: med("e2eS"),
    rawS: med("rawS"),
    appCpuS: med("appCpuS"),
    dbCpuS: med("dbCpuS"),
    rawDbCpuS: med("rawDbCpuS"),
    peakRssMb: Math.max(...results.map((r) => r.peakRssMb)),
    peakHwmMb: Math.max(...results.map((r) => r.peakHwmMb)),
    idleRssMb: med("idleRssMb"),
  };
  const head = [
    "run",
    "rows",
    "file MB",
    "upload s",
    "preview s",
    "load s",
    "(parse+LOAD DATA s)",
    "end-to-end s",
    "rows/s ours",
    "rows/s raw",
    "ours/raw",
    "peak RSS MB",
    "VmHWM MB",
    "ratio RSS preview",
  ];
  const medianRatio = median(ratios);
  const table = results.map((r, i) => line(String(i + 1), r, ratios[i]));
  if (results.length > 1) table.push(line(`median of ${results.length}`, medianRun, medianRatio));
  console.log(formatTable(head, table));
  console.log(
    `goals: ours/raw ≤ ${GOALS.ratio} (end to end: upload + preview + load + totals, against the raw LOAD DATA statement of the same run; median row: median of the runs' ratios), peak RSS ≤ ${GOALS.rssMb} MB (sum of VmRSS over the next start process tree, sampled every 50 ms; the median row shows the largest), preview < ${GOALS.previewS} s (upload answer minus transfer end).`,
  );
  console.log(
    formatTable(
      ["run", "CPU s ours: app + fake", "CPU s ours: mariadbd", "CPU s raw: mariadbd", "CPU ours/raw"],
      [...results, ...(results.length > 1 ? [medianRun] : [])].map((r, i) => [
        i < results.length ? String(i + 1) : "median",
        r.appCpuS.toFixed(2),
        r.dbCpuS.toFixed(2),
        r.rawDbCpuS.toFixed(2),
        ((r.appCpuS + r.dbCpuS) / r.rawDbCpuS).toFixed(2),
      ]),
    ),
  );
  console.log(
    "CPU seconds are user + system time from /proc/<pid>/stat: they show the work done, which other load on the machine inflates less than wall time (mariadbd's figure includes other clients' queries at the time).",
  );
  console.log(
    `server RSS before each import: ${results.map((r) => r.idleRssMb.toFixed(0)).join(", ")} MB; raw LOAD DATA s: ${results.map((r) => r.rawS.toFixed(2)).join(", ")}`,
  );
  return medianRatio <= GOALS.ratio && medianRun.peakRssMb <= GOALS.rssMb && medianRun.previewS < GOALS.previewS;
}

async function main(): Promise<void> {
  loadLocalEnv(ROOT);
  const rows = argValue("rows", 1_000_000);
  const runs = argValue("runs", 3);
  const nodeFlags = (process.env.BENCH_NODE_FLAGS ?? "").split(/\s+/).filter(Boolean);
  const db: MariaDbClient = {
    socket: BENCH.socket,
    user: process.env.DB_USER ?? "sondage",
    password: process.env.DB_PASSWORD ?? "",
    database: BENCH.database,
  };
  const dir = mkdtempSync(path.join(tmpdir(), "sondage-import-bench-"));
  const outDir = path.join(ROOT, "tests/bench/out");
  mkdirSync(outDir, { recursive: true });
  let app: RunningApp | null = null;
  const cleanUp = async () => {
    await app?.stop();
    app = null;
    rmSync(dir, { recursive: true, force: true });
    rmSync(path.join(ROOT, BENCH.uploadDir), { recursive: true, force: true });
    rmSync(path.join(ROOT, ".data", BENCH.fakesData), { recursive: true, force: true });
  };
  process.once("SIGINT", () => void cleanUp().finally(() => process.exit(130)));
  process.once("SIGTERM", () => void cleanUp().finally(() => process.exit(143)));
  try {
    const csv = path.join(dir, "bench-receivables.csv");
    let t = performance.now();
    await generateLedgerCsv(csv, rows, SEED);
    const totals = await readLedgerTotals(csv);
    const fileMb = statSync(csv).size / 1024 / 1024;
    log(
      `generated ${totals.rows.toLocaleString("en-US")} rows, ${fileMb.toFixed(1)} MB, line ending ${JSON.stringify(totals.lineEnding)}, total ${centsToDecimal(totals.totalCents)} (${((performance.now() - t) / 1000).toFixed(1)} s)`,
    );
    if (totals.rows !== rows) throw new Error(`the generator wrote ${totals.rows} rows, not ${rows}`);

    await ensureDatabaseServer();
    t = performance.now();
    await prepareDatabase();
    log(`database ${BENCH.database} recreated and seeded (${((performance.now() - t) / 1000).toFixed(1)} s)`);
    await buildIfNeeded(log);
    const serverLog = path.join(outDir, "import-server.log");
    writeFileSync(serverLog, "");
    app = await startApp(serverLog, nodeFlags);
    log(
      `app on ${APP_URL} (pid ${app.server.pid}${nodeFlags.length ? `, node ${nodeFlags.join(" ")}` : ""}), storage fake on :${BENCH.s3Port}; server log ${path.relative(ROOT, serverLog)}`,
    );

    const session = new HttpSession(APP_URL);
    await session.signIn(SENIOR.email, SENIOR.password);
    const engagementId = await findEngagementId(session);

    const dbPid = mariadbPid(path.join(ROOT, ".data/mariadb/mariadbd.pid"));
    const results: RunResult[] = [];
    let csvFingerprint: string | undefined;
    for (let i = 1; i <= runs; i += 1) {
      // Each run starts from an empty items table, as the raw load starts from a fresh scratch table.
      await mariadb(db, "TRUNCATE TABLE population_items");
      const raw = await rawLoad(db, csv, totals.lineEnding, dbPid);
      if (raw.rows !== totals.rows || raw.warnings !== "")
        throw new Error(`raw LOAD DATA stored ${raw.rows} rows with warnings: ${raw.warnings.slice(0, 500)}`);
      const ours = await importThroughRoutes({ session, engagementId, csv, totals, app, db, dbPid, run: i });
      results.push({ ...ours, rawS: raw.seconds, rawDbCpuS: raw.dbCpuS });
      csvFingerprint ??= ours.fingerprint;
      log(
        `run ${i}: end to end ${ours.e2eS.toFixed(2)} s (upload ${ours.uploadS.toFixed(2)} s, load ${ours.loadS.toFixed(2)} s), raw ${raw.seconds.toFixed(2)} s, peak RSS ${ours.peakRssMb.toFixed(0)} MB; count and total verified`,
      );
    }
    console.log(
      `\nSondage import benchmark — Node ${process.version}${nodeFlags.length ? ` (server: node ${nodeFlags.join(" ")})` : ""}, ${runs} run(s), mapping ${JSON.stringify(MAPPING)}`,
    );
    if (!report(results, rows, fileMb)) process.exitCode = 1;
    const xlsxRuns = argValue("xlsx-runs", 1);
    if (xlsxRuns > 0) {
      const xlsx = path.join(dir, "bench-receivables.xlsx");
      t = performance.now();
      const written = await csvToXlsx(csv, xlsx);
      log(
        `wrote the same ${written.toLocaleString("en-US")} rows as ${path.basename(xlsx)}, ${(statSync(xlsx).size / 1024 / 1024).toFixed(1)} MB (${((performance.now() - t) / 1000).toFixed(1)} s)`,
      );
      const csvE2e = median(results.map((r) => r.e2eS));
      const xlsxTimes: number[] = [];
      for (let i = 1; i <= xlsxRuns; i += 1) {
        await mariadb(db, "TRUNCATE TABLE population_items");
        const ours = await importThroughRoutes({
          session,
          engagementId,
          csv: xlsx,
          totals,
          app,
          db,
          dbPid,
          run: runs + i,
        });
        if (ours.fingerprint !== csvFingerprint)
          throw new Error(
            `the workbook's rows differ from the CSV's (fingerprint ${ours.fingerprint}, CSV ${csvFingerprint})`,
          );
        xlsxTimes.push(ours.e2eS);
        log(
          `xlsx run ${i}: end to end ${ours.e2eS.toFixed(2)} s (upload ${ours.uploadS.toFixed(2)} s, preview ${ours.previewS.toFixed(3)} s, load ${ours.loadS.toFixed(2)} s), peak RSS ${ours.peakRssMb.toFixed(0)} MB; count, total and every stored field verified against the CSV's`,
        );
      }
      const ratio = median(xlsxTimes) / csvE2e;
      console.log(
        `1,000,000-row ledger, same data: XLSX ${median(xlsxTimes).toFixed(2)} s vs CSV ${csvE2e.toFixed(2)} s end to end → ${ratio.toFixed(2)}× (goal ≤ ${GOALS.xlsxToCsv}×) ${passFail(ratio <= GOALS.xlsxToCsv)}; same count, total and stored fields: verified`.replace(
          "1,000,000",
          rows.toLocaleString("en-US"),
        ),
      );
      if (ratio > GOALS.xlsxToCsv) process.exitCode = 1;
    }
  } finally {
    await cleanUp();
  }
}

main().catch((err: unknown) => {
  console.error("[import bench] failed:", err instanceof Error ? (err.stack ?? err.message) : err);
  process.exitCode = 1;
});
