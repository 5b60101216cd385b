import autocannon from "autocannon";

export interface Figures {
  requests: number;
  rps: number;
  p50: number;
  p95: number;
  p99: number;
  max: number;
  errors: number;
  statuses: Record<string, number>;
}

export function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

export type Setup = (context: Record<string, unknown>) => {
  path: string;
  method?: string;
  headers: Record<string, string>;
  body?: string;
};
export type OnAnswer = (status: number, body: string, context: Record<string, unknown>) => void;

/**
 * Runs autocannon with one request template whose path, headers and body are chosen per request
 * (each connection keeps its own context: its user's cookie). Latency per answer is measured here
 * from the moment the request is prepared (pipelining 1: it is written at once), so p95 exists.
 */
export async function hammer(a: {
  url: string;
  connections: number;
  durationS: number;
  setup: Setup;
  onAnswer?: OnAnswer;
  ok: (status: number) => boolean;
}): Promise<Figures> {
  const latencies: number[] = [];
  const statuses: Record<string, number> = {};
  const result = await autocannon({
    url: a.url,
    connections: a.connections,
    duration: a.durationS,
    pipelining: 1,
    timeout: 20,
    requests: [
      {
        setupRequest: (req: Record<string, unknown>, context: Record<string, unknown>) => {
          const r = a.setup(context);
          context.sentAt = performance.now();
          return { ...req, method: r.method ?? "GET", path: r.path, headers: r.headers, body: r.body };
        },
        onResponse: (status: number, body: string, context: Record<string, unknown>) => {
          latencies.push(performance.now() - (context.sentAt as number));
          statuses[status] = (statuses[status] ?? 0) + 1;
          a.onAnswer?.(status, body, context);
        },
      },
    ],
  } as unknown as autocannon.Options);
  latencies.sort((x, y) => x - y);
  const bad = Object.entries(statuses)
    .filter(([s]) => !a.ok(Number(s)))
    .reduce((n, [, c]) => n + c, 0);
  return {
    requests: latencies.length,
    rps: latencies.length / a.durationS,
    p50: percentile(latencies, 50),
    p95: percentile(latencies, 95),
    p99: percentile(latencies, 99),
    max: latencies.at(-1) ?? Number.NaN,
    errors: bad + result.errors + result.timeouts,
    statuses,
  };
}

export const fmt = (f: Figures) =>
  `${f.requests} requests, ${f.rps.toFixed(1)} req/s, latency p50 ${f.p50.toFixed(1)} ms · p95 ${f.p95.toFixed(1)} ms · p99 ${f.p99.toFixed(1)} ms · max ${f.max.toFixed(0)} ms, errors ${f.errors}, statuses ${JSON.stringify(f.statuses)}`;
