/**
 * The one NDJSON writer: a streamed answer of one JSON object per line, for the long operations
 * (population load, advisor run) that report progress while they work.
 */
export const NDJSON_HEADERS = {
  "content-type": "application/x-ndjson; charset=utf-8",
  "cache-control": "no-store",
  "x-accel-buffering": "no",
} as const;

const encoder = new TextEncoder();

/** One event as its line of bytes. */
export const ndjsonLine = (event: unknown) => encoder.encode(`${JSON.stringify(event)}\n`);

/** A complete answer of already-known events (a cached result). */
export function ndjsonOf(...events: unknown[]): Response {
  return new Response(events.map((e) => JSON.stringify(e) + "\n").join(""), { headers: NDJSON_HEADERS });
}

/**
 * Streams what `produce` sends. Sends after the browser went away are dropped (the work carries on and
 * finishes or rolls back by itself); `onCancel` hears that the reader went away.
 */
export function ndjsonStream<E>(produce: (send: (event: E) => void) => Promise<void>, onCancel?: () => void): Response {
  let closed = false;
  const body = new ReadableStream<Uint8Array>({
    async start(controller) {
      const send = (event: E) => {
        if (closed) return;
        try {
          controller.enqueue(ndjsonLine(event));
        } catch {
          closed = true;
        }
      };
      try {
        await produce(send);
      } finally {
        if (!closed) {
          closed = true;
          try {
            controller.close();
          } catch {
            /* already closed */
          }
        }
      }
    },
    cancel() {
      closed = true;
      onCancel?.();
    },
  });
  return new Response(body, { headers: NDJSON_HEADERS });
}
