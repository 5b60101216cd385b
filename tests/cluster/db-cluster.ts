/**
 * A three-node MariaDB Galera cluster on loopback with HAProxy in front (one writer, the others
 * as backups), from Debian's mariadb-server and galera-4.
 *
 *   npm run cluster:db      start it and keep it running (Ctrl-C stops it): nodes 4871–4873, front door
 *                           127.0.0.1:4870, data under .data/galera/node{1,2,3} (owned by mysql)
 *   npm run test:cluster    start it, run the integration suite through the front door
 *                           (INTEGRATION_SLOT 41, DB_PORT 4870), then the faults below, then stop it;
 *                           `npm run test:cluster -- <files…>` runs only those integration files
 *
 * Faults (test:cluster): the product on the cluster against a single server (app-faults.ts: a 1M-row
 * load on each, the writer killed during saves and during a load, a backup killed during a load),
 * then a node killed (SIGKILL) and rejoining by state transfer, catching up on what was written
 * while it was down. Exits non-zero when the suite fails or a node does not catch up.
 */
import { spawn } from "node:child_process";
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { loadLocalEnv } from "../../db/load-env";
import { ROOT, startService, stopService, type Service } from "../bench/support/processes";
import { runAppFaults, type ClusterControl } from "./app-faults";
import { databaseFrontDoorConfig, writeConfig } from "./haproxy";
import {
  DATA,
  FRONT_PORT,
  NODES,
  client,
  clusterSize,
  createUsers,
  ensureGaleraPackages,
  initialiseDataFolders,
  killNode,
  startNode,
  waitFor,
} from "./galera";

loadLocalEnv();
const mode = process.argv[2] === "test" ? "test" : "serve";
// `npm run test:cluster -- <files…>` runs only those integration files through the front door (the faults run in full).
const suiteFiles = process.argv.slice(3);
const LOG = path.join(DATA, "..", "galera.log");
const log = (line: string) => console.log(`[cluster:db] ${line}`);
const figures: string[] = [];
const report = (line: string) => {
  figures.push(line);
  log(line);
};

function runIntegrationSuite(): Promise<number> {
  return new Promise((resolve) => {
    // backup-restore drives the private server's own socket (mariadb-dump / restore) and is left out here.
    const child = spawn(
      path.join(ROOT, "node_modules/.bin/vitest"),
      ["run", "--project", "integration", "--exclude", "tests/integration/backup-restore.test.ts", ...suiteFiles],
      {
        cwd: ROOT,
        stdio: "inherit",
        env: {
          ...process.env,
          DB_HOST: "127.0.0.1",
          DB_PORT: String(FRONT_PORT),
          INTEGRATION_SLOT: process.env.INTEGRATION_SLOT ?? "41",
          INTEGRATION_TIMEOUT_SCALE: "3",
        },
      },
    );
    child.on("exit", (code) => resolve(code ?? 1));
  });
}

async function rejoinByStateTransfer(nodes: Service[]): Promise<void> {
  client(
    1,
    "CREATE TABLE IF NOT EXISTS sondage.cluster_probe (id INT AUTO_INCREMENT PRIMARY KEY, note VARCHAR(100)) ENGINE=InnoDB",
  );
  await killNode(nodes[2]);
  await waitFor("cluster of 2", () => clusterSize(1) === 2, 60_000);
  const values = Array.from({ length: 500 }, (_, i) => `('written while node 3 was down ${i}')`).join(",");
  client(1, `INSERT INTO sondage.cluster_probe (note) VALUES ${values}`);
  const started = performance.now();
  nodes[2] = await startNode(3, LOG);
  await waitFor("cluster of 3", () => clusterSize(1) === 3, 60_000);
  const [on1, on3] = [
    client(1, "SELECT COUNT(*) FROM sondage.cluster_probe"),
    client(3, "SELECT COUNT(*) FROM sondage.cluster_probe"),
  ].map((s) => Number(s.trim()));
  report(
    `node 3 SIGKILLed, 500 rows written on the others, node 3 restarted: Synced again after ${((performance.now() - started) / 1000).toFixed(1)} s; rows on node 1 ${on1}, on node 3 ${on3} → ${on1 === on3 ? "caught up" : "NOT caught up"}`,
  );
  if (on1 !== on3) process.exitCode = 1;
}

async function main() {
  ensureGaleraPackages();
  mkdirSync(DATA, { recursive: true });
  writeFileSync(LOG, "");
  initialiseDataFolders();
  const nodes: Service[] = [];
  let haproxy: Service | null = null;
  const stopAll = async () => {
    if (haproxy) await stopService(haproxy);
    for (const s of [...nodes].reverse()) await stopService(s, 30_000);
  };
  process.on("SIGINT", () => void stopAll().then(() => process.exit(0)));
  try {
    let t = performance.now();
    nodes.push(await startNode(1, LOG, true));
    createUsers(process.env.DB_USER ?? "sondage", process.env.DB_PASSWORD ?? "");
    nodes.push(await startNode(2, LOG));
    nodes.push(await startNode(3, LOG));
    await waitFor("cluster of 3", () => clusterSize(1) === 3);
    report(
      `three nodes Synced, wsrep_cluster_size ${clusterSize(1)} (${((performance.now() - t) / 1000).toFixed(1)} s from an empty folder)`,
    );
    const cfg = path.join(DATA, "haproxy.cfg");
    writeConfig(
      cfg,
      databaseFrontDoorConfig({ frontPort: FRONT_PORT, nodes: NODES.map((x) => x.port), checkUser: "haproxy_check" }),
    );
    haproxy = startService("haproxy", "haproxy", ["-f", cfg, "-db"], process.env, LOG);
    log(
      `front door 127.0.0.1:${FRONT_PORT} → writer node 1 (${NODES[0].port}), backups ${NODES.slice(1)
        .map((x) => x.port)
        .join(", ")}`,
    );
    if (mode === "serve") {
      log("running; point DB_HOST=127.0.0.1 DB_PORT=4870 at it. Ctrl-C stops it.");
      await Promise.race(nodes.map((s) => s.exited));
      return;
    }
    t = performance.now();
    const code = await runIntegrationSuite();
    report(
      `integration ${suiteFiles.length ? suiteFiles.join(", ") : "suite"} through the front door: exit ${code} in ${((performance.now() - t) / 1000).toFixed(0)} s`,
    );
    if (code !== 0) process.exitCode = 1;
    report(
      `settings read back on node 1: ${client(1, "SELECT CONCAT_WS(', ', CONCAT('wsrep_max_ws_size ', @@wsrep_max_ws_size), CONCAT('wsrep_load_data_splitting ', @@wsrep_load_data_splitting), CONCAT('wsrep_trx_fragment_size ', @@wsrep_trx_fragment_size), CONCAT('binlog_format ', @@binlog_format))").trim()}`,
    );
    const control: ClusterControl = {
      kill: (n) => killNode(nodes[n - 1]),
      start: async (n) => {
        nodes[n - 1] = await startNode(n, LOG);
      },
    };
    await runAppFaults(control, report, log, LOG);
    await rejoinByStateTransfer(nodes);
  } finally {
    await stopAll();
    console.log("\n== cluster figures\n" + figures.map((f) => `- ${f}`).join("\n"));
  }
}

main().catch((err: unknown) => {
  console.error("[cluster:db] failed:", err instanceof Error ? err.message : err);
  process.exit(1);
});
