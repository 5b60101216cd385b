/**
 * Two `next start` app servers behind HAProxy (round-robin, health checks on /api/health), with
 * the storage and mail fakes — the product on more than one app server.
 *
 *   npm run cluster:app                       the demo on http://127.0.0.1:3290 (database sondage_clusterapp,
 *                                             servers 3291/3292, fakes 4790/2790/2791, build .next-cluster)
 *   E2E_CLUSTER=1 E2E_SLOT=n npx playwright test   the e2e suite through the front door (playwright.config.ts
 *                                             runs this file with --front <its port> and its slot's settings)
 *   npm run cluster:app -- --kill-one         then 20 users reading through the front door for 20 s while app
 *                                             server 1 is SIGKILLed at 5 s (restarted at 12 s): every answer
 *                                             counted; then it keeps running as above
 *
 * Runs until stopped (Ctrl-C); stopping it stops everything it started.
 */
import { mkdirSync } from "node:fs";
import path from "node:path";
import { loadLocalEnv } from "../../db/load-env";
import { ROOT, run, startService, stopService, waitForHttp, type Service } from "../bench/support/processes";
import { appFrontDoorConfig, ensureHaproxy, writeConfig } from "./haproxy";
import { killOneServer } from "./app-kill";

loadLocalEnv();
const args = process.argv.slice(2);
const flag = (name: string) => {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
};
// Under Playwright, which stops its web servers by SIGKILLing their process group, the app servers and
// HAProxy stay in that group so they go with it instead of outliving the run and holding its ports.
const underPlaywright = flag("--front") !== undefined;
const FRONT = Number(flag("--front") ?? 3290);
// Two ports per front door: slot n (front 3100+n) gets 3500+2n and 3501+2n, so slots never share one.
const SERVERS = [2 * FRONT - 2700, 2 * FRONT - 2699];
const DIST = process.env.NEXT_DIST_DIR ?? ".next-cluster";
const DATA = path.join(ROOT, ".data", `cluster-app-${FRONT}`);
const LOG = path.join(DATA, "cluster-app.log");
const log = (line: string) => console.log(`[cluster:app] ${line}`);

const standaloneEnv = (): Record<string, string> => ({
  DB_NAME: "sondage_clusterapp",
  S3_ENDPOINT: "http://127.0.0.1:4790",
  S3_BUCKET: "sondage-cluster-app",
  SMTP_HOST: "127.0.0.1",
  SMTP_PORT: "2790",
  MAIL_INBOX_PORT: "2791",
  UPLOAD_DIR: ".data/uploads-cluster-app",
  FAKES_DATA: "fakes-cluster-app",
});

async function main() {
  mkdirSync(DATA, { recursive: true });
  ensureHaproxy();
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    ...(underPlaywright ? {} : standaloneEnv()),
    NEXTAUTH_URL: `http://127.0.0.1:${FRONT}`,
    NEXT_DIST_DIR: DIST,
    TRUSTED_PROXY: "127.0.0.1",
    NEXT_TELEMETRY_DISABLED: "1",
  };
  const services: Service[] = [];
  const stopAll = async () => {
    for (const s of services.reverse()) await stopService(s);
  };
  process.on("SIGINT", () => void stopAll().then(() => process.exit(0)));
  process.on("SIGTERM", () => void stopAll().then(() => process.exit(0)));
  try {
    if (!underPlaywright) {
      await run("bash", ["db/scripts/db-server.sh"], env);
      await run("npx", ["tsx", "db/migrate.ts", "recreate"], env);
      await run("npx", ["tsx", "db/seed.ts"], env);
      await run("bash", ["db/scripts/build-app.sh"], env);
      services.push(
        startService("fakes", path.join(ROOT, "node_modules/.bin/tsx"), ["lib/fakes/run-fakes.ts"], env, LOG),
      );
      await waitForHttp(`${env.S3_ENDPOINT}/`, services[0]);
    }
    for (const port of SERVERS) {
      services.push(
        startService(
          `next start :${port}`,
          process.execPath,
          ["node_modules/next/dist/bin/next", "start", "-H", "127.0.0.1", "-p", String(port)],
          env,
          LOG,
          { ownGroup: !underPlaywright },
        ),
      );
    }
    for (const [i, port] of SERVERS.entries())
      await waitForHttp(`http://127.0.0.1:${port}/api/health`, services[services.length - SERVERS.length + i]);
    const cfg = path.join(DATA, "haproxy.cfg");
    writeConfig(cfg, appFrontDoorConfig({ frontPort: FRONT, servers: SERVERS }));
    const haproxy = startService("haproxy", "haproxy", ["-f", cfg, "-db"], env, LOG, { ownGroup: !underPlaywright });
    services.push(haproxy);
    await waitForHttp(`http://127.0.0.1:${FRONT}/api/health`, haproxy);
    const pids = new Set<number>();
    for (let i = 0; i < 4; i++)
      pids.add(((await (await fetch(`http://127.0.0.1:${FRONT}/api/health`)).json()) as { pid: number }).pid);
    log(
      `front door http://127.0.0.1:${FRONT} → app servers ${SERVERS.join(", ")} (round-robin; 4 health answers came from ${pids.size} processes); log ${path.relative(ROOT, LOG)}`,
    );
    if (!underPlaywright) {
      await run("npx", ["tsx", "db/seeds/demo-fieldwork.ts", `http://127.0.0.1:${FRONT}`], env).catch((err: unknown) =>
        log(`demo fieldwork not loaded: ${String(err).slice(0, 300)}`),
      );
      if (args.includes("--kill-one")) {
        const appIndex = services.length - SERVERS.length - 1;
        const restart = () =>
          startService(
            `next start :${SERVERS[0]}`,
            process.execPath,
            ["node_modules/next/dist/bin/next", "start", "-H", "127.0.0.1", "-p", String(SERVERS[0])],
            env,
            LOG,
          );
        services[appIndex] = await killOneServer({
          front: `http://127.0.0.1:${FRONT}`,
          victim: services[appIndex],
          victimHealthUrl: `http://127.0.0.1:${SERVERS[0]}/api/health`,
          restart,
          log,
        });
      }
      log(
        `Sondage on http://127.0.0.1:${FRONT} — sign in as manager@marrow-quill.example / sondage-demo-2026. Ctrl-C stops it.`,
      );
    }
    await Promise.race(
      services.map((s) =>
        s.exited.then((code) => {
          throw new Error(`${s.name} exited (${code})`);
        }),
      ),
    );
  } catch (err) {
    console.error("[cluster:app]", err instanceof Error ? err.message : err);
    await stopAll();
    process.exit(1);
  }
}

void main();
