import { execFile } from "node:child_process";
import { existsSync, mkdirSync, rmSync } from "node:fs";
import path from "node:path";
import { ROOT, run, startService, type Service } from "./processes";

/**
 * A MariaDB server of the load benchmark's own (data under .data/mariadb-load, its own port), so
 * the fault runs can SIGKILL it without touching the server the tests use. Defaults as the product
 * runs them (binary log off is the only change: durability, innodb_flush_log_at_trx_commit=1, kept).
 */
export class PrivateMariaDb {
  readonly socket: string;
  private service: Service | null = null;

  constructor(
    readonly port: number,
    private readonly logPath: string,
    readonly dataDir = path.join(ROOT, ".data/mariadb-load"),
  ) {
    this.socket = path.join(dataDir, "mariadbd.sock");
  }

  private client(args: string[], input?: string) {
    return run("mariadb", ["--no-defaults", `--socket=${this.socket}`, "-uroot", ...args], process.env, input);
  }

  ping(): Promise<boolean> {
    return new Promise((resolve) => {
      execFile("mariadb-admin", ["--no-defaults", `--socket=${this.socket}`, "-uroot", "ping"], (err) => resolve(!err));
    });
  }

  async start(): Promise<void> {
    if (!existsSync(path.join(this.dataDir, "data/mysql"))) {
      mkdirSync(this.dataDir, { recursive: true });
      await run("mariadb-install-db", [
        "--no-defaults",
        `--datadir=${this.dataDir}/data`,
        `--user=${process.env.USER ?? "root"}`,
        "--auth-root-authentication-method=socket",
        "--skip-test-db",
        "--skip-name-resolve",
      ]);
    }
    rmSync(this.socket, { force: true });
    rmSync(path.join(this.dataDir, "mariadbd.pid"), { force: true });
    this.service = startService(
      "bench mariadbd",
      "/usr/sbin/mariadbd",
      [
        "--no-defaults",
        `--datadir=${this.dataDir}/data`,
        `--socket=${this.socket}`,
        `--port=${this.port}`,
        "--bind-address=127.0.0.1",
        `--user=${process.env.USER ?? "root"}`,
        `--pid-file=${this.dataDir}/mariadbd.pid`,
        `--log-error=${this.dataDir}/error.log`,
        "--skip-name-resolve",
        "--local-infile=1",
        "--character-set-server=utf8mb4",
        "--collation-server=utf8mb4_unicode_ci",
        "--max-allowed-packet=256M",
        "--skip-log-bin",
        "--max-connections=400",
      ],
      process.env,
      this.logPath,
    );
    for (let i = 0; i < 300 && !(await this.ping()); i++) await new Promise((r) => setTimeout(r, 100));
    if (!(await this.ping())) throw new Error(`bench mariadbd did not start; see ${this.dataDir}/error.log`);
  }

  /** The app's user and database on this server (credentials from .env.local). */
  async createDatabase(name: string): Promise<void> {
    const { DB_USER: u, DB_PASSWORD: p } = process.env;
    await this.client(
      [],
      [
        `DROP DATABASE IF EXISTS \`${name}\`;`,
        `CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`,
        ...["localhost", "127.0.0.1"].flatMap((h) => [
          `CREATE USER IF NOT EXISTS '${u}'@'${h}' IDENTIFIED BY '${p}';`,
          `GRANT ALL PRIVILEGES ON \`${name}\`.* TO '${u}'@'${h}';`,
        ]),
        "FLUSH PRIVILEGES;",
      ].join("\n"),
    );
  }

  /** SIGKILL, as a crash or an OOM kill would: no clean shutdown. */
  async kill(): Promise<void> {
    if (!this.service) return;
    try {
      process.kill(this.service.pid, "SIGKILL");
    } catch {
      /* gone */
    }
    await this.service.exited;
    this.service = null;
  }

  async stop(): Promise<void> {
    if (!this.service) return;
    await new Promise<void>((resolve) =>
      execFile("mariadb-admin", ["--no-defaults", `--socket=${this.socket}`, "-uroot", "shutdown"], () => resolve()),
    );
    await this.service?.exited;
    this.service = null;
  }
}
