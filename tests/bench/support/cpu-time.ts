import { readFileSync } from "node:fs";
import { processTree } from "./rss-sampler";

const TICKS_PER_SECOND = 100; // USER_HZ on Linux (common practice; `getconf CLK_TCK` prints 100)

/** User + system CPU seconds used so far by a process (all its threads), or 0 once it is gone. */
function processCpuSeconds(pid: number): number {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, "utf8");
    // Fields after the command name, which sits in parentheses and may contain spaces.
    const fields = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
    return (Number(fields[11]) + Number(fields[12])) / TICKS_PER_SECOND; // utime, stime (fields 14, 15)
  } catch {
    return 0;
  }
}

/** CPU seconds used so far by each process tree, summed. */
export function cpuSeconds(...rootPids: number[]): number {
  let total = 0;
  for (const root of rootPids) for (const pid of processTree(root)) total += processCpuSeconds(pid);
  return total;
}

/** The private MariaDB server's pid (db/scripts/db-server.sh writes it). */
export function mariadbPid(pidFile: string): number {
  return Number(readFileSync(pidFile, "utf8").trim());
}
