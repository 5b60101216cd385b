/**
 * The product on the Galera cluster, measured and hurt (the second half of `npm run test:cluster`):
 * one `next start` (3251) on the cluster's front door and, as the reference in the same run, one
 * (3250) on a single MariaDB server of its own (4869, data under .data/mariadb-cluster-ref); same
 * build, same storage and mail fakes (4850, 2850/2851), database sondage_cluster on both.
 *  1. The same 1,000,000-row CSV loaded on the single server and on the cluster: time and ratio,
 *     and the population's rows counted on every node.
 *  2. 50 staff saving on one sample while the writer node is SIGKILLed: every answer counted (200,
 *     409, 503 — never 500), every acknowledged save checked afterwards, the node restarted.
 *  3. A 1,000,000-row load with the writer SIGKILLed in the middle (absent on every node), and one
 *     with a backup node SIGKILLed in the middle (complete on every node once it has rejoined).
 */
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import knex from "knex";
import { buildKnexConfig } from "../../db/knex-config";
import { HttpSession } from "../bench/support/http-session";
import { ROOT, run, startService, stopService, waitForHttp, type Service } from "../bench/support/processes";
import { PrivateMariaDb } from "../bench/support/private-db";
import { burstWithKill, startLoad, type KillableDatabase } from "../bench/load/faults";
import { addLoadUsers, drawSample, sampleItems, signInAll, uploadLedger } from "../bench/load/fixtures";
import { FRONT_PORT, client } from "./galera";

const PORTS = { single: 3250, cluster: 3251, s3: 4850, smtp: 2850, inbox: 2851, singleDb: 4869 };
const DB_NAME = "sondage_cluster";
const DIST = process.env.NEXT_DIST_DIR ?? ".next-cluster";
const MILLION = 1_000_000;
const USERS = 50;

export interface ClusterControl {
  /** SIGKILL node n (1…3) and wait for it to be gone. */
  kill(n: number): Promise<void>;
  /** Start node n again and wait until it is Synced (a state transfer if it needs one). */
  start(n: number): Promise<void>;
}
type Say = (line: string) => void;

const url = (port: number) => `http://127.0.0.1:${port}`;
const env = (dbPort: number, appPort: number): NodeJS.ProcessEnv => ({
  ...process.env,
  DB_HOST: "127.0.0.1",
  DB_PORT: String(dbPort),
  DB_NAME,
  NEXTAUTH_URL: url(appPort),
  NEXT_DIST_DIR: DIST,
  S3_ENDPOINT: url(PORTS.s3),
  S3_BUCKET: "sondage-cluster",
  SMTP_HOST: "127.0.0.1",
  SMTP_PORT: String(PORTS.smtp),
  MAIL_INBOX_PORT: String(PORTS.inbox),
  UPLOAD_DIR: ".data/uploads-cluster",
  FAKES_DATA: "fakes-cluster",
  NEXT_TELEMETRY_DISABLED: "1",
});

/** Rows of each population above `afterId` as node n holds them (read on the node itself, not through the front door). */
function populationsOnNode(n: number, afterId: number): string {
  const out = client(
    n,
    `SELECT p.id, p.row_count, (SELECT COUNT(*) FROM ${DB_NAME}.population_items i WHERE i.population_id = p.id) FROM ${DB_NAME}.populations p WHERE p.id > ${afterId} ORDER BY p.id`,
  );
  const rows = out
    .trim()
    .split("\n")
    .filter(Boolean)
    .map((l) => l.split("\t").map(Number));
  return rows.length
    ? rows
        .map(
          ([id, declared, items]) =>
            `#${id}: ${items.toLocaleString("en-US")} of ${declared.toLocaleString("en-US")} rows`,
        )
        .join(", ")
    : "none";
}

/**
 * Node n's view once it has applied what the cluster committed: a replica applies a write set
 * after the writer's commit (certification is synchronous, applying is not), so this polls until
 * the node's last committed seqno reaches the writer's, up to 5 minutes. Says how long that took.
 */
async function populationsOnNodeApplied(n: number, afterId: number, writer = 1): Promise<string> {
  const seqno = (k: number) =>
    Number(client(k, "SHOW GLOBAL STATUS LIKE 'wsrep_last_committed'").trim().split("\t")[1]);
  const target = seqno(writer);
  const started = performance.now();
  while (seqno(n) < target && performance.now() - started < 300_000) await new Promise((r) => setTimeout(r, 500));
  return `${populationsOnNode(n, afterId)} (applied ${((performance.now() - started) / 1000).toFixed(1)} s after the writer's commit)`;
}
const maxPopulationOnNode = (n: number) =>
  Number(client(n, `SELECT COALESCE(MAX(id), 0) FROM ${DB_NAME}.populations`).trim());

async function prepareDatabase(e: NodeJS.ProcessEnv, recreate: boolean): Promise<void> {
  await run("npx", ["tsx", "db/migrate.ts", recreate ? "recreate" : "latest"], e);
  await run("npx", ["tsx", "db/seed.ts"], e);
}

async function startApp(port: number, e: NodeJS.ProcessEnv, logPath: string): Promise<Service> {
  const app = startService(
    `next start :${port}`,
    process.execPath,
    ["node_modules/next/dist/bin/next", "start", "-H", "127.0.0.1", "-p", String(port)],
    e,
    logPath,
  );
  await waitForHttp(`${url(port)}/api/auth/csrf`, app, 120_000);
  return app;
}

async function signedInSenior(port: number): Promise<{ senior: HttpSession; base: string; engagementId: number }> {
  const senior = new HttpSession(url(port));
  await senior.signIn("senior@marrow-quill.example", "sondage-demo-2026");
  const { engagements } = await senior.json<{ engagements: { id: number; clientName: string }[] }>("/api/engagements");
  const engagementId = engagements.find((x) => x.clientName.startsWith("Tessaly"))!.id;
  return { senior, base: `/api/engagements/${engagementId}`, engagementId };
}

/** Uploads and loads the generated ledger; the load's own time (upload excluded) and its last event. */
async function timedLoad(senior: HttpSession, base: string, rows: number, name: string, log: Say) {
  const { uploadId } = await uploadLedger(senior, base, rows, name, log);
  const load = startLoad(senior, base, uploadId, name);
  const result = await load.done;
  return { uploadId, ms: result.ms, last: result.last, error: result.error, events: load.events };
}

/** Starts a load and SIGKILLs node `victim` once `atRows` rows have been read; the load's outcome. */
async function loadWithKill(
  senior: HttpSession,
  base: string,
  name: string,
  victim: number,
  atRows: number,
  cluster: ClusterControl,
  log: Say,
) {
  const { uploadId } = await uploadLedger(senior, base, MILLION, name, log);
  const load = startLoad(senior, base, uploadId, name);
  const deadline = performance.now() + 300_000;
  while (performance.now() < deadline && !load.events.some((e) => (e.rowsRead ?? 0) >= atRows || e.type !== "progress"))
    await new Promise((r) => setTimeout(r, 100));
  const at = load.events.at(-1);
  await cluster.kill(victim);
  const outcome = await load.done;
  return {
    at:
      at?.phase === "checking"
        ? `${(at.rowsRead ?? 0).toLocaleString("en-US")} rows read`
        : (at?.phase ?? at?.type ?? "nothing yet"),
    outcome,
  };
}

/** After a node has come back (HAProxy closes the sessions a backup held): until the app answers 200 three times running. */
async function settle(session: HttpSession): Promise<void> {
  for (let ok = 0, tries = 0; ok < 3 && tries < 120; tries++) {
    const res = await session.fetch("/api/me").catch(() => null);
    await res?.text();
    ok = res?.status === 200 ? ok + 1 : 0;
    await new Promise((r) => setTimeout(r, 500));
  }
}

export async function runAppFaults(cluster: ClusterControl, report: Say, log: Say, logPath: string): Promise<void> {
  if (!existsSync(path.join(ROOT, DIST, "BUILD_ID"))) {
    log(`building into ${DIST}…`);
    await run("bash", ["db/scripts/build-app.sh"], env(FRONT_PORT, PORTS.cluster));
  }
  const single = new PrivateMariaDb(PORTS.singleDb, logPath, path.join(ROOT, ".data/mariadb-cluster-ref"));
  const services: Service[] = [];
  const clusterLog = path.join(path.dirname(logPath), "cluster-app-on-galera.log");
  try {
    await single.start();
    await single.createDatabase(DB_NAME);
    await prepareDatabase(env(PORTS.singleDb, PORTS.single), false);
    await prepareDatabase(env(FRONT_PORT, PORTS.cluster), true);
    services.push(
      startService(
        "fakes",
        path.join(ROOT, "node_modules/.bin/tsx"),
        ["lib/fakes/run-fakes.ts"],
        env(FRONT_PORT, PORTS.cluster),
        logPath,
      ),
    );
    await waitForHttp(`${url(PORTS.s3)}/`, services[0]);
    services.push(await startApp(PORTS.single, env(PORTS.singleDb, PORTS.single), logPath));
    services.push(await startApp(PORTS.cluster, env(FRONT_PORT, PORTS.cluster), clusterLog));

    // 1. The same 1M-row load on one server and on the cluster.
    const one = await signedInSenior(PORTS.single);
    const many = await signedInSenior(PORTS.cluster);
    const ref = await timedLoad(one.senior, one.base, MILLION, "cluster-ref-single", log);
    const before = maxPopulationOnNode(1);
    const onCluster = await timedLoad(many.senior, many.base, MILLION, "cluster-ref-galera", log);
    const nodes = [
      `node 1 ${populationsOnNode(1, before)}`,
      `node 2 ${await populationsOnNodeApplied(2, before)}`,
      `node 3 ${await populationsOnNodeApplied(3, before)}`,
    ].join("; ");
    report(
      `1,000,000-row CSV load (one transaction, one write set, wsrep_max_ws_size 2 GB, no streaming): single server ${(ref.ms / 1000).toFixed(1)} s (${ref.last?.type}), Galera through the front door ${(onCluster.ms / 1000).toFixed(1)} s (${onCluster.last?.type}) → cluster / single ${(onCluster.ms / ref.ms).toFixed(2)}×; rows on each node: ${nodes}`,
    );

    // 2. The writer killed during a burst of saves.
    const db = knex(buildKnexConfig(env(FRONT_PORT, PORTS.cluster)));
    const emails = await addLoadUsers(db, many.engagementId, USERS).finally(() => db.destroy());
    const sessions = await signInAll(url(PORTS.cluster), emails);
    const small = await timedLoad(many.senior, many.base, 5_000, "cluster-saves-5k", log);
    const smallId = small.last!.populationId!;
    const { population } = await many.senior.json<{ population: { total: string; rowCount: number } }>(
      `${many.base}/populations/${smallId}`,
    );
    await many.senior.json(`${many.base}/populations/${smallId}/reconciliation`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ controlTotal: population.total, controlCount: population.rowCount }),
    });
    const sampleId = await drawSample(many.senior, many.base, smallId, 100);
    const items = await sampleItems(many.senior, many.base, sampleId);
    const writer: KillableDatabase = { kill: () => cluster.kill(1), start: () => cluster.start(1) };
    const burst = await burstWithKill({
      sessions,
      base: many.base,
      sampleId,
      items,
      dbServer: writer,
      db: () => knex(buildKnexConfig(env(FRONT_PORT, PORTS.cluster))),
      totalMs: 15_000,
      killAtMs: 3_000,
      restartAtMs: 15_000,
    });
    const other = Object.keys(burst.ledger.other).length ? JSON.stringify(burst.ledger.other) : "none";
    report(
      `writer (node 1) SIGKILLed 3 s into a burst of saves (${USERS} staff, 15 s; node 1 restarted after it): ${burst.verification.acked} acknowledged, ${burst.ledger.conflicts} × 409, ${burst.ledger.unavailable} × 503 (first ${burst.firstUnavailableMs.toFixed(0)} ms after the kill), other statuses ${other}, transport errors ${burst.networkErrors}`,
    );
    report(
      `burst verified through the front door: lost ${burst.verification.lost}, duplicate versions ${burst.verification.duplicateVersions}, wrong final values ${burst.verification.wrongFinal}, committed but unacknowledged ${burst.verification.unacknowledgedCommits}`,
    );

    // 3. A node killed in the middle of a 1M-row load: the writer, then a backup.
    await settle(many.senior);
    let mark = maxPopulationOnNode(2);
    const writerCut = await loadWithKill(many.senior, many.base, "cluster-kill-writer", 1, 400_000, cluster, log);
    const survivors = `node 2 ${populationsOnNode(2, mark)}, node 3 ${populationsOnNode(3, mark)}`;
    await cluster.start(1);
    await settle(many.senior);
    report(
      `writer (node 1) SIGKILLed during a 1M-row load (at ${writerCut.at}): the load answered ${writerCut.outcome.last?.type} ${writerCut.outcome.last?.status ?? ""} "${writerCut.outcome.last?.message ?? writerCut.outcome.error}"; populations from it — ${survivors}; node 1 after rejoining ${populationsOnNode(1, mark)} (absent on every node is the right answer)`,
    );
    mark = maxPopulationOnNode(1);
    const backupCut = await loadWithKill(many.senior, many.base, "cluster-kill-backup", 3, 400_000, cluster, log);
    const whileDown = `node 1 ${populationsOnNode(1, mark)}; node 2 ${await populationsOnNodeApplied(2, mark)}`;
    const started = performance.now();
    await cluster.start(3);
    await settle(many.senior);
    report(
      `backup (node 3) SIGKILLed during a 1M-row load (at ${backupCut.at}): the load answered ${backupCut.outcome.last?.type} ${backupCut.outcome.last?.rowCount ?? backupCut.outcome.last?.message ?? backupCut.outcome.error ?? ""}; ${whileDown}; node 3 restarted and Synced by state transfer in ${((performance.now() - started) / 1000).toFixed(1)} s, then holds ${populationsOnNode(3, mark)}`,
    );
  } finally {
    for (const s of services.reverse()) await stopService(s);
    await single.stop();
    const retries = existsSync(clusterLog)
      ? (readFileSync(clusterLog, "utf8").match(/\[sondage\] deadlock retry/g) ?? []).length
      : 0;
    report(
      `transactions re-run after a deadlock / certification conflict (1213) by the app on the cluster, counted in its log: ${retries}`,
    );
  }
}
