import { execFileSync, spawn } from "node:child_process";
import { existsSync, mkdirSync, rmSync } from "node:fs";
import path from "node:path";
import { ROOT, startService, stopService, type Service } from "../bench/support/processes";

/** Node n (1…3): its MariaDB port, Galera replication, IST and SST ports, on loopback. */
// Replication ports 4910/4920/4930 (+1 IST, +2 SST): clear of the test slots' storage fakes (tests/integration/test-env.ts, tests/e2e/slot.ts).
export const node = (n: number) => ({
  n,
  port: 4870 + n,
  gcomm: 4900 + n * 10,
  ist: 4901 + n * 10,
  sst: 4902 + n * 10,
});
export const NODES = [1, 2, 3].map(node);
export const FRONT_PORT = 4870;
export const DATA = path.join(ROOT, ".data/galera");
const dir = (n: number) => path.join(DATA, `node${n}`);
export const socketOf = (n: number) => path.join(dir(n), "mariadbd.sock");
const sh = (cmd: string, args: string[], input?: string) =>
  execFileSync(cmd, args, { input, stdio: ["pipe", "pipe", "pipe"] }).toString();

/** Debian's mariadb-server, galera-4, rsync, socat and haproxy, installed with apt when missing. */
export function ensureGaleraPackages(): void {
  const missing = [
    ["mariadbd", "mariadb-server"],
    ["rsync", "rsync"],
    ["socat", "socat"],
    ["haproxy", "haproxy"],
  ]
    .filter(([bin]) => {
      try {
        sh("sh", ["-c", `command -v ${bin}`]);
        return false;
      } catch {
        return true;
      }
    })
    .map(([, pkg]) => pkg);
  if (!existsSync("/usr/lib/galera/libgalera_smm.so")) missing.push("galera-4");
  if (!missing.length) return;
  const sudo = process.getuid?.() === 0 ? [] : ["sudo"];
  const run = (args: string[]) =>
    execFileSync(sudo.length ? "sudo" : args[0], sudo.length ? args : args.slice(1), {
      stdio: "inherit",
      env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" },
    });
  run(["apt-get", "update", "-qq"]);
  run(["apt-get", "install", "-y", "-qq", "--no-install-recommends", ...missing]);
}

/**
 * Galera settings per node (../shared/STACK-NOTES.md, verified here with mariadb 10.11 and
 * galera-4 26.4): ROW binlog, interleaved auto-increment locks, rsync state transfer, and — for
 * the 1,000,000-row population load, one large write set — wsrep_max_ws_size at its 2 GB ceiling.
 * The nodes run as the `mysql` user with data folders it owns: as root, the joiner's rsync daemon
 * drops to `nobody` and every state transfer fails.
 */
function nodeArgs(n: number, bootstrap: boolean): string[] {
  const me = node(n);
  return [
    "--no-defaults",
    `--datadir=${dir(n)}`,
    `--socket=${socketOf(n)}`,
    `--port=${me.port}`,
    "--bind-address=127.0.0.1",
    "--user=mysql",
    `--pid-file=${dir(n)}/mariadbd.pid`,
    `--log-error=${dir(n)}/error.log`,
    "--skip-name-resolve",
    "--local-infile=1",
    "--character-set-server=utf8mb4",
    "--collation-server=utf8mb4_unicode_ci",
    "--binlog-format=ROW",
    "--innodb-autoinc-lock-mode=2",
    "--wsrep-on=ON",
    "--wsrep-provider=/usr/lib/galera/libgalera_smm.so",
    `--wsrep-cluster-address=gcomm://${NODES.map((x) => `127.0.0.1:${x.gcomm}`).join(",")}`,
    `--wsrep-node-address=127.0.0.1:${me.gcomm}`,
    `--wsrep-provider-options=gmcast.listen_addr=tcp://127.0.0.1:${me.gcomm};ist.recv_addr=127.0.0.1:${me.ist}`,
    `--wsrep-sst-receive-address=127.0.0.1:${me.sst}`,
    "--wsrep-sst-method=rsync",
    "--wsrep-cluster-name=sondage",
    `--wsrep-node-name=node${n}`,
    "--wsrep-max-ws-size=2147483647",
    "--innodb-buffer-pool-size=256M",
    ...(bootstrap ? ["--wsrep-new-cluster"] : []),
  ];
}

export function client(n: number, sql: string): string {
  return sh("mariadb", ["--no-defaults", `--socket=${socketOf(n)}`, "-uroot", "-N", "-B", "-e", sql]);
}

export async function waitFor(what: string, test: () => boolean, timeoutMs = 120_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    try {
      if (test()) return;
    } catch {
      /* not yet */
    }
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`timed out waiting for ${what}`);
}

const status = (n: number, name: string) => client(n, `SHOW GLOBAL STATUS LIKE '${name}'`).trim().split("\t")[1];
export const clusterSize = (n: number) => Number(status(n, "wsrep_cluster_size"));
export const isSynced = (n: number) => status(n, "wsrep_local_state_comment") === "Synced";

/** Starts node n (the first one bootstraps a new cluster) and waits until it is Synced. */
export async function startNode(n: number, logPath: string, bootstrap = false): Promise<Service> {
  rmSync(socketOf(n), { force: true });
  rmSync(`${dir(n)}/mariadbd.pid`, { force: true });
  const service = startService(`galera node ${n}`, "mariadbd", nodeArgs(n, bootstrap), process.env, logPath);
  await waitFor(`node ${n} Synced`, () => isSynced(n));
  return service;
}

/** Fresh data folders owned by mysql; the first node's initialised (the others receive it by state transfer). */
export function initialiseDataFolders(): void {
  rmSync(DATA, { recursive: true, force: true });
  for (const { n } of NODES) mkdirSync(dir(n), { recursive: true });
  sh("mariadb-install-db", [
    "--no-defaults",
    `--datadir=${dir(1)}`,
    "--user=mysql",
    "--auth-root-authentication-method=socket",
    "--skip-test-db",
    "--skip-name-resolve",
  ]);
  sh("chown", ["-R", "mysql:mysql", DATA]);
}

/** The app's user on every node (replicated), and the password-less user HAProxy's mysql-check logs in as. */
export function createUsers(user: string, password: string): void {
  const q = (s: string) => s.replace(/'/g, "''");
  client(
    1,
    [
      `CREATE USER IF NOT EXISTS '${q(user)}'@'127.0.0.1' IDENTIFIED BY '${q(password)}'`,
      `GRANT ALL PRIVILEGES ON \`sondage\`.* TO '${q(user)}'@'127.0.0.1'`,
      `GRANT ALL PRIVILEGES ON \`sondage\\_%\`.* TO '${q(user)}'@'127.0.0.1'`,
      "CREATE USER IF NOT EXISTS 'haproxy_check'@'127.0.0.1'",
      "CREATE DATABASE IF NOT EXISTS sondage CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci",
    ].join("; "),
  );
}

export async function killNode(service: Service): Promise<void> {
  try {
    process.kill(-service.pid, "SIGKILL");
  } catch {
    /* gone */
  }
  await service.exited;
}

export { stopService, spawn };
