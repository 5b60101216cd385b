import type { LoadEvent } from "@/lib/populations/stream-load";
import { readErrorAnswer } from "@/components/ui/api";

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
  const reader = res.body.getReader();
  const decoder = new TextDecoder();
  let pending = "";
  let last: LoadEvent | null = null;
  const take = (line: string) => {
    if (!line.trim()) return;
    last = JSON.parse(line) as LoadEvent;
    onEvent(last);
  };
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    pending += decoder.decode(value, { stream: true });
    const lines = pending.split("\n");
    pending = lines.pop() ?? "";
    lines.forEach(take);
  }
  take(pending + decoder.decode());
  if (last === null) {
    const event: LoadEvent = { type: "error", status: 0, message: "The connection closed before the load finished. Nothing was stored; try again." };
    onEvent(event);
    return event;
  }
  return last;
}
