import { execFileSync } from "node:child_process";
import { writeFileSync } from "node:fs";

/** Installs Debian's haproxy when it is missing (as `npm start` installs MariaDB). */
export function ensureHaproxy(): void {
  try {
    execFileSync("haproxy", ["-v"], { stdio: "ignore" });
  } catch {
    const sudo = process.getuid?.() === 0 ? [] : ["sudo"];
    const sh = (args: string[]) =>
      execFileSync(sudo[0] ?? args[0], sudo.length ? args : args.slice(1), {
        stdio: "inherit",
        env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" },
      });
    sh(["apt-get", "update", "-qq"]);
    sh(["apt-get", "install", "-y", "-qq", "--no-install-recommends", "haproxy"]);
  }
}

/**
 * An HTTP front door: round-robin over the app servers, each checked on GET /api/health every
 * second (out after 2 failures, back after 1 success), the client's address appended to
 * X-Forwarded-For (the app trusts it from TRUSTED_PROXY only). Long server timeout: a population
 * load streams its progress for up to 10 minutes.
 */
export function appFrontDoorConfig(a: { frontPort: number; servers: number[] }): string {
  return `global
  maxconn 4000

defaults
  mode http
  timeout connect 5s
  timeout client 650s
  timeout server 650s
  timeout http-request 30s
  option forwardfor
  option redispatch
  retries 2

frontend sondage
  bind 127.0.0.1:${a.frontPort}
  default_backend app

backend app
  balance roundrobin
  option httpchk GET /api/health
  http-check expect status 200
  default-server inter 1s fall 2 rise 1
${a.servers.map((p, i) => `  server app${i + 1} 127.0.0.1:${p} check`).join("\n")}
`;
}

/**
 * A TCP front door for a Galera cluster: one writer at a time, the other nodes as backups (the
 * usual way to keep certification conflicts away), checked with MariaDB's handshake
 * (\`option mysql-check\` with a user that needs no password from 127.0.0.1). When the writer comes
 * back, sessions on a backup are closed so that writes return to one node.
 */
export function databaseFrontDoorConfig(a: { frontPort: number; nodes: number[]; checkUser: string }): string {
  return `global
  maxconn 4000

defaults
  mode tcp
  timeout connect 3s
  timeout client 30m
  timeout server 30m
  retries 2

frontend galera
  bind 127.0.0.1:${a.frontPort}
  default_backend nodes

backend nodes
  option mysql-check user ${a.checkUser}
  default-server inter 1s fall 2 rise 2 on-marked-down shutdown-sessions on-marked-up shutdown-backup-sessions
${a.nodes.map((p, i) => `  server node${i + 1} 127.0.0.1:${p} check${i === 0 ? "" : " backup"}`).join("\n")}
`;
}

export function writeConfig(path: string, text: string): void {
  writeFileSync(path, text);
  execFileSync("haproxy", ["-c", "-q", "-f", path], { stdio: "inherit" });
}
