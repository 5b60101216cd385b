import { HttpSession } from "../bench/support/http-session";
import { waitForHttp, type Service } from "../bench/support/processes";

const USERS = 20;
const RUN_MS = 20_000;
const KILL_AT_MS = 5_000;
const RESTART_AT_MS = 12_000;

/**
 * 20 loops reading the engagement list through the front door for 20 s; app server `victim` is
 * SIGKILLed at 5 s and started again at 12 s. Every answer is counted, with the answers that
 * failed while it was down: the goal is that a killed server costs at most the requests it held.
 * Returns the restarted server.
 */
export async function killOneServer(a: {
  front: string;
  victim: Service;
  victimHealthUrl: string;
  restart: () => Service;
  log: (line: string) => void;
}): Promise<Service> {
  const session = new HttpSession(a.front);
  await session.signIn("manager@marrow-quill.example", "sondage-demo-2026");
  const statuses: Record<string, number> = {};
  let transportErrors = 0;
  const failuresAt: number[] = [];
  const start = performance.now();
  let restarted: Service = a.victim;
  const killer = (async () => {
    await new Promise((r) => setTimeout(r, KILL_AT_MS));
    try {
      process.kill(-a.victim.pid, "SIGKILL");
    } catch {
      /* gone */
    }
    await a.victim.exited;
    await new Promise((r) => setTimeout(r, RESTART_AT_MS - KILL_AT_MS));
    restarted = a.restart();
  })();
  await Promise.all(
    Array.from({ length: USERS }, async () => {
      while (performance.now() - start < RUN_MS) {
        try {
          const res = await session.fetch("/api/engagements");
          await res.text();
          statuses[res.status] = (statuses[res.status] ?? 0) + 1;
          if (res.status !== 200) failuresAt.push(performance.now() - start);
        } catch {
          transportErrors++;
          failuresAt.push(performance.now() - start);
        }
      }
    }),
  );
  await killer;
  const total = Object.values(statuses).reduce((x, y) => x + y, 0) + transportErrors;
  const window = failuresAt.length
    ? `${((Math.min(...failuresAt) - KILL_AT_MS) / 1000).toFixed(2)}…${((Math.max(...failuresAt) - KILL_AT_MS) / 1000).toFixed(2)} s after the kill`
    : "none";
  a.log(
    `app server killed (SIGKILL) 5 s into 20 readers × 20 s through the front door, restarted at 12 s: ${total} requests, statuses ${JSON.stringify(statuses)}, transport errors ${transportErrors}; failed answers ${failuresAt.length} (${window})`,
  );
  await waitForHttp(a.victimHealthUrl, restarted, 120_000);
  return restarted;
}
