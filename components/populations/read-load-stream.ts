import type { LoadEvent } from "@/lib/populations/stream-load";
import { readErrorAnswer } from "@/components/ui/api";
import { readNdjson } from "@/components/ui/ndjson";

export type { LoadEvent };

/**
 * Starts a load and hands each NDJSON event to `onEvent` as it arrives; resolves with the last
 * one (the outcome). A refusal before streaming (400/403/409) comes back as an "error" event.
 */
export async function runLoad(url: string, body: unknown, onEvent: (event: LoadEvent) => void): Promise<LoadEvent> {
  const res = await fetch(url, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  if (!res.ok || !res.body) {
    const data = await readErrorAnswer(res);
    const event: LoadEvent = { type: "error", status: res.status, message: data.error?.message ?? `The load was refused (${res.status}).` };
    onEvent(event);
    return event;
  }
  const last = await readNdjson<LoadEvent>(res.body, onEvent);
  if (last === null) {
    const event: LoadEvent = { type: "error", status: 0, message: "The connection closed before the load finished. Nothing was stored; try again." };
    onEvent(event);
    return event;
  }
  return last;
}
