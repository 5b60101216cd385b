import "server-only";
import { randomUUID } from "node:crypto";
import os from "node:os";

const globalForInstance = globalThis as unknown as { sondageInstanceId?: string };

/** This server process's name in leases and claims: host, pid and a random part (a restarted process is a new holder). */
export function instanceId(): string {
  globalForInstance.sondageInstanceId ??= `${os.hostname()}:${process.pid}:${randomUUID().slice(0, 8)}`;
  return globalForInstance.sondageInstanceId;
}
