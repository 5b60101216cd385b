import "server-only";
import type { Knex } from "knex";
import { claimUploadForLoading, type UploadRecord } from "@/lib/data/population-uploads";
import type { LoadPopulation } from "@/lib/validation/population";
import { AppError, isDatabaseUnavailable } from "@/lib/errors";
import { ImportError } from "@/lib/imports";
import { loadPopulation, type LoadProgress } from "./load-population";
import { ndjsonStream } from "@/lib/http/ndjson";
import { instanceId } from "@/lib/workers/instance-id";

/** How many problems the screen shows; the full list is the downloadable CSV. */
export const PROBLEMS_ON_SCREEN = 100;

export type LoadEvent =
  | ({ type: "progress" } & LoadProgress)
  | { type: "loaded"; populationId: number; rowCount: number; total: string }
  | {
      type: "rejected";
      problemCount: number;
      problems: { row: number; column: string | null; reason: string }[];
      problemsTruncated: boolean;
    }
  | { type: "error"; status: number; message: string };

/** Runs a load and answers with one JSON line per event: progress (throttled), then the outcome (the browser going away does not stop it). */
export async function streamPopulationLoad(
  db: Knex,
  args: { upload: UploadRecord; actorId: number; input: LoadPopulation },
): Promise<Response> {
  const holder = instanceId();
  await claimUploadForLoading(db, { uploadId: args.upload.id, userId: args.actorId, holder }); // 409 before any streaming
  return ndjsonStream<LoadEvent>(async (send) => {
    let lastSent = 0;
    const onProgress = (p: LoadProgress) => {
      const now = Date.now();
      if (p.phase !== "checking" || now - lastSent > 200) {
        lastSent = now;
        send({ type: "progress", ...p });
      }
    };
    try {
      const outcome = await loadPopulation(db, { ...args, holder, onProgress });
      if (outcome.ok)
        send({ type: "loaded", populationId: outcome.populationId, rowCount: outcome.rowCount, total: outcome.total });
      else
        send({
          type: "rejected",
          problemCount: outcome.problemCount,
          problems: outcome.problems.slice(0, PROBLEMS_ON_SCREEN),
          problemsTruncated: outcome.problemCount > PROBLEMS_ON_SCREEN,
        });
    } catch (err) {
      if (err instanceof ImportError || err instanceof AppError)
        send({ type: "error", status: err.status, message: err.message });
      else if (isDatabaseUnavailable(err)) {
        console.error("[sondage] population load: database unavailable", (err as { code?: string }).code ?? err);
        send({
          type: "error",
          status: 503,
          message:
            "The database stopped answering during the load. Nothing was stored (the load is one transaction); load the file again once it is back.",
        });
      } else {
        console.error("[sondage] population load failed", err);
        send({
          type: "error",
          status: 500,
          message: "The load failed on our side and nothing was stored. The error has been logged.",
        });
      }
    }
  });
}
