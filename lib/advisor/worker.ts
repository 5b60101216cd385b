/** Worker-thread entry: runs one advisor job and posts progress, then the result (or the error). */
import { parentPort, workerData } from "node:worker_threads";
import { EngineInputError } from "@/lib/sampling";
import { runAdvisorJob, type AdvisorJob } from "./compute";

const PROGRESS_INTERVAL_MS = 100;
let lastPost = 0;
try {
  const result = runAdvisorJob(workerData as AdvisorJob, (done, total) => {
    const now = Date.now();
    if (done < total && now - lastPost < PROGRESS_INTERVAL_MS) return;
    lastPost = now;
    parentPort!.postMessage({ type: "progress", done, total });
  });
  parentPort!.postMessage({ type: "result", result });
} catch (err) {
  parentPort!.postMessage({
    type: "error",
    message: err instanceof Error ? err.message : String(err),
    range: err instanceof EngineInputError,
  });
}
