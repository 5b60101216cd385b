import { percentile } from "./measure";

export interface OpenLoopFigures {
  sent: number;
  answered: number;
  p50: number;
  p95: number;
  p99: number;
  max: number;
  statuses: Record<string, number>;
  transportErrors: number;
  lateStarts: number;
}

/** Exponential inter-arrival time for a Poisson process of the given mean (inverse transform sampling). */
export const exponential = (meanMs: number) => -meanMs * Math.log(1 - Math.random());

/**
 * Open-loop load: each of `users` sends at Poisson arrival times averaging one request every
 * `meanGapMs`, for `durationMs`, whether or not its earlier requests have been answered — as
 * people work, unlike a closed loop that waits for each answer and so slows itself down when the
 * server does. Latency is from the scheduled arrival, so a server that falls behind shows it.
 */
export async function openLoop(a: {
  users: number;
  meanGapMs: number;
  durationMs: number;
  send: (user: number) => Promise<number>;
}): Promise<OpenLoopFigures> {
  const latencies: number[] = [];
  const statuses: Record<string, number> = {};
  const pending: Promise<void>[] = [];
  let sent = 0,
    transportErrors = 0,
    lateStarts = 0;
  const start = performance.now();
  const user = async (u: number) => {
    let at = start + exponential(a.meanGapMs);
    while (at < start + a.durationMs) {
      const wait = at - performance.now();
      if (wait > 0) await new Promise((r) => setTimeout(r, wait));
      else if (wait < -20) lateStarts++;
      const scheduled = at;
      sent++;
      pending.push(
        a.send(u).then(
          (status) => {
            latencies.push(performance.now() - scheduled);
            statuses[status] = (statuses[status] ?? 0) + 1;
          },
          () => {
            transportErrors++;
          },
        ),
      );
      at += exponential(a.meanGapMs);
    }
  };
  await Promise.all(Array.from({ length: a.users }, (_, u) => user(u)));
  await Promise.all(pending);
  latencies.sort((x, y) => x - y);
  return {
    sent,
    answered: latencies.length,
    p50: percentile(latencies, 50),
    p95: percentile(latencies, 95),
    p99: percentile(latencies, 99),
    max: latencies.at(-1) ?? Number.NaN,
    statuses,
    transportErrors,
    lateStarts,
  };
}
