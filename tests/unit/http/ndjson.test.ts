import { describe, expect, it } from "vitest";
import { ndjsonOf, ndjsonStream } from "@/lib/http/ndjson";
import { readNdjson } from "@/components/ui/ndjson";

/** A body that delivers `bytes` in chunks cut at the given offsets (splitting lines and multi-byte characters). */
function chunked(bytes: Uint8Array, cuts: number[]): ReadableStream<Uint8Array> {
  const points = [0, ...cuts, bytes.length];
  return new ReadableStream({
    start(controller) {
      for (let i = 0; i + 1 < points.length; i++) controller.enqueue(bytes.slice(points[i], points[i + 1]));
      controller.close();
    },
  });
}

describe("the NDJSON writer and reader (one of each)", () => {
  it("hands over every event in order whatever the chunking, including a character split across chunks", async () => {
    const res = ndjsonStream<{ n: number; text: string }>(async (send) => {
      for (let n = 1; n <= 3; n++) send({ n, text: `Société Générale − ${n}` });
      await Promise.resolve();
    });
    expect(res.headers.get("content-type")).toBe("application/x-ndjson; charset=utf-8");
    const bytes = new Uint8Array(await res.arrayBuffer());
    const accentAt = bytes.indexOf(0xc3); // first byte of "é"
    const seen: number[] = [];
    const last = await readNdjson<{ n: number; text: string }>(
      chunked(bytes, [accentAt + 1, accentAt + 30, bytes.length - 2]),
      (e) => seen.push(e.n),
    );
    expect(seen).toEqual([1, 2, 3]);
    expect(last).toEqual({ n: 3, text: "Société Générale − 3" });
  });

  it("reads a complete answer, and says null for a stream closed before any event", async () => {
    const one = ndjsonOf({ type: "result", cached: true });
    expect(await readNdjson(one.body!, () => undefined)).toEqual({ type: "result", cached: true });
    expect(await readNdjson(chunked(new Uint8Array(), []), () => undefined)).toBeNull();
  });

  it("tells the producer's owner when the reader goes away, and drops later sends", async () => {
    let cancelled = false;
    let release: () => void = () => undefined;
    const res = ndjsonStream<number>(
      async (send) => {
        send(1);
        await new Promise<void>((r) => {
          release = r;
        });
        send(2);
      },
      () => {
        cancelled = true;
      },
    );
    const reader = res.body!.getReader();
    await reader.read();
    await reader.cancel();
    release();
    expect(cancelled).toBe(true);
  });
});
