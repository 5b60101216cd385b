import "server-only";
import { Worker } from "node:worker_threads";
import type { AdvisorJob, AdvisorResult } from "./compute";

export class AdvisorCancelled extends Error {
  constructor() {
    super("The advisor run was cancelled.");
  }
}
export class AdvisorInputError extends Error {}

// Runs in progress in this server process, by advisor run id, so a cancel request can reach them.
const running = new Map<number, Worker>();
const cancelled = new Set<number>();

export const isAdvisorRunning = (runId: number) => running.has(runId);

/** Workers one server process runs at once; more would only slow every run and the other requests. */
export const MAX_CONCURRENT_RUNS = 2;
export const advisorRunsInProgress = () => running.size;

/** Stops a run in progress; false when this process is not running it. */
export function cancelAdvisorRun(runId: number): boolean {
  const worker = running.get(runId);
  if (!worker) return false;
  cancelled.add(runId);
  void worker.terminate();
  return true;
}

// Unbundled (tests, scripts) the worker source is TypeScript, so a small bootstrap loads it through
// tsx. In the built app the bundler rewrites the URL to the compiled worker chunk.
// (import.meta.url still names runner.ts inside the bundle, so Next's own runtime flag tells them apart.)
const fromSource = !process.env.NEXT_RUNTIME;

function spawnWorker(job: AdvisorJob): Worker {
  if (fromSource) {
    const source = JSON.stringify(import.meta.url.replace(/runner\.ts$/, "worker.ts"));
    return new Worker(`import("tsx/esm/api").then(({ tsImport }) => tsImport(${source}, ${source}))`, {
      eval: true,
      workerData: job,
    });
  }
  return new Worker(new URL("./worker.ts", import.meta.url), { workerData: job });
}

/**
 * Runs the job in a worker thread so the server keeps answering other requests. Resolves with the
 * result, or rejects with AdvisorCancelled (cancelAdvisorRun), AdvisorInputError (the engine
 * refused the input) or an Error.
 */
export function runInWorker(
  runId: number,
  job: AdvisorJob,
  onProgress: (done: number, total: number) => void,
): Promise<AdvisorResult> {
  return new Promise((resolve, reject) => {
    const worker = spawnWorker(job);
    running.set(runId, worker);
    let settled = false;
    const settle = (fn: () => void) => {
      if (settled) return;
      settled = true;
      running.delete(runId);
      fn();
    };
    worker.on(
      "message",
      (m: {
        type: string;
        done?: number;
        total?: number;
        result?: AdvisorResult;
        message?: string;
        range?: boolean;
      }) => {
        if (m.type === "progress") onProgress(m.done!, m.total!);
        else if (m.type === "result") settle(() => resolve(m.result!));
        else if (m.type === "error")
          settle(() => reject(m.range ? new AdvisorInputError(m.message) : new Error(m.message)));
      },
    );
    worker.on("error", (err) => settle(() => reject(err)));
    worker.on("exit", (code) =>
      settle(() => {
        const wasCancelled = cancelled.delete(runId);
        reject(
          wasCancelled
            ? new AdvisorCancelled()
            : new Error(`The advisor worker stopped unexpectedly (exit code ${code}).`),
        );
      }),
    );
  });
}
