import { existsSync, readFileSync, readdirSync, statSync, writeFileSync } from "node:fs";
import net from "node:net";
import path from "node:path";
import { ROOT, run, startService, stopService, waitForHttp, type Service } from "./processes";

export { ROOT };
export const BENCH = {
  database: "sondage_bench",
  appPort: 3200,
  // Not a port of an e2e or integration slot (tests/e2e/slot.ts, tests/integration/test-env.ts).
  s3Port: Number(process.env.BENCH_S3_PORT ?? 4697),
  // Mail fakes of its own too: the demo (npm start) holds 2525/2580, and the integration and e2e slots take 2535–2538 + 10 per slot (tests/integration/test-env.ts, tests/e2e/slot.ts)
  smtpPort: Number(process.env.BENCH_SMTP_PORT ?? 2894),
  inboxPort: Number(process.env.BENCH_INBOX_PORT ?? 2899),
  distDir: process.env.NEXT_DIST_DIR ?? ".next-bench",
  uploadDir: ".data/uploads-bench",
  fakesData: "fakes-bench",
  bucket: "sondage-bench",
  socket: path.join(ROOT, ".data/mariadb/mariadbd.sock"),
} as const;

export const APP_URL = `http://127.0.0.1:${BENCH.appPort}`;

/** The environment of every child: .env.local's values (already loaded) with the benchmark's own winning. */
export function benchEnv(extra: Record<string, string> = {}): NodeJS.ProcessEnv {
  return {
    ...process.env,
    DB_NAME: BENCH.database,
    NEXTAUTH_URL: APP_URL,
    NEXT_DIST_DIR: BENCH.distDir,
    S3_ENDPOINT: `http://127.0.0.1:${BENCH.s3Port}`,
    S3_BUCKET: BENCH.bucket,
    SMTP_HOST: "127.0.0.1",
    SMTP_PORT: String(BENCH.smtpPort),
    MAIL_INBOX_PORT: String(BENCH.inboxPort),
    UPLOAD_DIR: BENCH.uploadDir,
    FAKES_DATA: BENCH.fakesData,
    ...extra,
  };
}

/** Starts the private MariaDB server only when it does not answer (db-server.sh is idempotent). */
export async function ensureDatabaseServer(): Promise<void> {
  try {
    await run("mariadb-admin", ["--no-defaults", `--socket=${BENCH.socket}`, "-uroot", "ping"]);
  } catch {
    await run("bash", [path.join(ROOT, "db/scripts/db-server.sh")]);
  }
}

/** Recreates sondage_bench with every migration and the demo scenario. */
export async function prepareDatabase(): Promise<void> {
  const env = benchEnv();
  await run("npx", ["tsx", "db/migrate.ts", "recreate"], env);
  await run("npx", ["tsx", "db/seed.ts"], env);
}

function newestSourceMtime(dir: string): number {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) newest = Math.max(newest, newestSourceMtime(full));
    else if (/\.(tsx?|css|mjs)$/.test(entry.name)) newest = Math.max(newest, statSync(full).mtimeMs);
  }
  return newest;
}

/** Builds into .next-bench when there is no build or a source file is newer than it. */
export async function buildIfNeeded(log: (line: string) => void): Promise<void> {
  const buildId = path.join(ROOT, BENCH.distDir, "BUILD_ID");
  const sources = Math.max(
    ...["app", "lib", "db", "components", "templates"]
      .filter((d) => existsSync(path.join(ROOT, d)))
      .map((d) => newestSourceMtime(path.join(ROOT, d))),
  );
  if (existsSync(buildId) && statSync(buildId).mtimeMs > sources && process.env.BENCH_REBUILD !== "1") return;
  log(`building the app into ${BENCH.distDir} (next build)…`);
  // next build rewrites tsconfig.json to add its dist folder's type paths: put it back afterwards.
  const tsconfig = path.join(ROOT, "tsconfig.json");
  const saved = readFileSync(tsconfig, "utf8");
  try {
    await run("npx", ["next", "build"], benchEnv());
  } catch (err) {
    // The tree is shared: someone's half-finished file can break the build. Say so and measure the last build.
    if (!existsSync(buildId)) throw err;
    log(
      `WARNING: next build failed; measuring the previous build of ${statSync(buildId).mtime.toISOString()}:\n${String(err).slice(-1500)}`,
    );
  } finally {
    if (readFileSync(tsconfig, "utf8") !== saved) writeFileSync(tsconfig, saved);
  }
}

export interface RunningApp {
  server: Service;
  fakes: Service;
  stop(): Promise<void>;
}

/** Refuses to start when a port is taken: a readiness check would otherwise talk to someone else's server. */
async function assertPortFree(port: number, what: string): Promise<void> {
  await new Promise<void>((resolve, reject) => {
    const probe = net.createServer();
    probe.once("error", () =>
      reject(
        new Error(`port ${port} (${what}) is already in use on 127.0.0.1; stop what holds it or set BENCH_S3_PORT`),
      ),
    );
    probe.listen(port, "127.0.0.1", () => probe.close(() => resolve()));
  });
}

/** Starts the storage fake and `next start` (node directly, so its pid is the server's). */
export async function startApp(logPath: string, nodeFlags: string[]): Promise<RunningApp> {
  await assertPortFree(BENCH.s3Port, "storage fake");
  await assertPortFree(BENCH.smtpPort, "mail fake");
  await assertPortFree(BENCH.inboxPort, "mail inbox");
  await assertPortFree(BENCH.appPort, "app");
  const env = benchEnv();
  const fakes = startService(
    "storage fake",
    path.join(ROOT, "node_modules/.bin/tsx"),
    ["lib/fakes/run-fakes.ts"],
    env,
    logPath,
  );
  const server = startService(
    "next start",
    process.execPath,
    [...nodeFlags, "node_modules/next/dist/bin/next", "start", "-H", "127.0.0.1", "-p", String(BENCH.appPort)],
    env,
    logPath,
  );
  const app = {
    server,
    fakes,
    async stop() {
      await Promise.all([stopService(server), stopService(fakes)]);
    },
  };
  try {
    await waitForHttp(`http://127.0.0.1:${BENCH.s3Port}/`, fakes);
    await waitForHttp(`${APP_URL}/api/auth/csrf`, server);
  } catch (err) {
    await app.stop();
    throw err;
  }
  return app;
}
