/**
 * The one NDJSON reader of the client: hands each event of a streamed answer to `onEvent` as its
 * line arrives, and resolves with the last one (null when the stream closed before any).
 */
export async function readNdjson<E>(body: ReadableStream<Uint8Array>, onEvent: (event: E) => void): Promise<E | null> {
  const reader = body.getReader();
  const decoder = new TextDecoder();
  let pending = "";
  let last: E | null = null;
  const take = (line: string) => {
    if (!line.trim()) return;
    last = JSON.parse(line) as E;
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
  return last;
}
