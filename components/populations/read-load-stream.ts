import type { LoadEvent } from "@/lib/populations/stream-load";
import { ApiError, apiStream } from "@/components/ui/api";
import { readNdjson } from "@/components/ui/ndjson";

export type { LoadEvent };

/**
 * Starts a load and hands each NDJSON event to `onEvent` as it arrives; resolves with the last
 * one (the outcome). A refusal before streaming (400/403/409) comes back as an "error" event.
 */
export async function runLoad(url: string, body: unknown, onEvent: (event: LoadEvent) => void): Promise<LoadEvent> {
  let stream: ReadableStream<Uint8Array>;
  try {
    stream = await apiStream(url, { body });
  } catch (err) {
    if (!(err instanceof ApiError)) throw err;
    const event: LoadEvent = { type: "error", status: err.status, message: err.message };
    onEvent(event);
    return event;
  }
  const last = await readNdjson<LoadEvent>(stream, onEvent);
  if (last === null) {
    const event: LoadEvent = {
      type: "error",
      status: 0,
      message: "The connection closed before the load finished. Nothing was stored; try again.",
    };
    onEvent(event);
    return event;
  }
  return last;
}
