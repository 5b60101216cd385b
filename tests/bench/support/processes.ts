import { spawn, type ChildProcess } from "node:child_process";
import { once } from "node:events";
import { createWriteStream } from "node:fs";
import path from "node:path";

/** The repository root: every child runs there. */
export const ROOT = path.resolve(import.meta.dirname, "../../..");

export interface Service {
  name: string;
  child: ChildProcess;
  pid: number;
  /** Whether the process leads a process group of its own (signals then go to the whole group). */
  ownGroup: boolean;
  /** Resolves with the exit code once the process has ended. */
  exited: Promise<number | null>;
}

/**
 * Starts a long-running process, its output appended to `logPath`: by default in its own process group
 * (so a kill reaches its helpers too); `ownGroup: false` keeps it in the caller's group, so whoever
 * SIGKILLs that group (Playwright stopping a web server) takes it down as well.
 */
export function startService(
  name: string,
  command: string,
  args: string[],
  env: NodeJS.ProcessEnv,
  logPath: string,
  { ownGroup = true }: { ownGroup?: boolean } = {},
): Service {
  const log = createWriteStream(logPath, { flags: "a" });
  const child = spawn(command, args, { cwd: ROOT, env, stdio: ["ignore", "pipe", "pipe"], detached: ownGroup });
  // end: false — a killed server's helpers (a Galera node's state-transfer scripts) may still write
  // to stderr after stdout has closed; ending the log then would crash the harness.
  child.stdout?.pipe(log, { end: false });
  child.stderr?.pipe(log, { end: false });
  if (child.pid === undefined) throw new Error(`${name}: could not start ${command}`);
  const exited = once(child, "exit").then(([code]) => code as number | null);
  return { name, child, pid: child.pid, ownGroup, exited };
}

/** SIGTERM to the service (its whole process group when it has one), SIGKILL after `graceMs`. */
export async function stopService(service: Service, graceMs = 5000): Promise<void> {
  if (service.child.exitCode !== null || service.child.signalCode !== null) return;
  const signal = (sig: NodeJS.Signals) => {
    try {
      process.kill(service.ownGroup ? -service.pid : service.pid, sig);
    } catch {
      /* already gone */
    }
  };
  signal("SIGTERM");
  const timer = setTimeout(() => signal("SIGKILL"), graceMs);
  await service.exited;
  clearTimeout(timer);
}

/** Polls `url` until it answers (any status below 500) or `timeoutMs` passes. */
export async function waitForHttp(url: string, service: Service, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (service.child.exitCode !== null)
      throw new Error(`${service.name} exited with code ${service.child.exitCode} before answering ${url}`);
    try {
      const res = await fetch(url, { redirect: "manual" });
      await res.arrayBuffer();
      if (res.status < 500) return;
    } catch {
      /* not listening yet */
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`${service.name} did not answer ${url} within ${timeoutMs} ms`);
}

/** Runs a command to completion, throwing with its output when it fails. */
export async function run(
  command: string,
  args: string[],
  env: NodeJS.ProcessEnv = process.env,
  input?: string,
): Promise<string> {
  const child = spawn(command, args, { cwd: ROOT, env, stdio: ["pipe", "pipe", "pipe"] });
  let out = "";
  child.stdout.on("data", (d: Buffer) => (out += d.toString()));
  child.stderr.on("data", (d: Buffer) => (out += d.toString()));
  child.stdin.end(input ?? "");
  const [code] = await once(child, "exit");
  if (code !== 0) throw new Error(`${command} ${args.join(" ")} failed (${code}):\n${out.slice(-4000)}`);
  return out;
}
