import { actAs } from "./session";

type RouteHandler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

export interface CallOptions {
  as: number | null;
  params?: Record<string, string>;
  body?: unknown;
  rawBody?: string;
  file?: Uint8Array;
  headers?: Record<string, string>;
  query?: Record<string, string>;
}

function buildRequest(method: string, { body, rawBody, file, headers = {}, query }: CallOptions): Request {
  const url = new URL("http://127.0.0.1/api/test");
  for (const [k, v] of Object.entries(query ?? {})) url.searchParams.set(k, v);
  const init: RequestInit & { duplex?: string } = { method, headers: { ...headers } };
  if (file !== undefined) {
    init.body = file as Uint8Array<ArrayBuffer>;
    init.headers = {
      "content-type": "application/octet-stream",
      "content-length": String(file.byteLength),
      ...headers,
    };
  } else if (rawBody !== undefined || body !== undefined) {
    init.body = rawBody ?? JSON.stringify(body);
    init.headers = { "content-type": "application/json", ...headers };
  }
  return new Request(url, init);
}

/** Calls a route handler the way Next does, as the given user; returns the raw Response. */
export async function callRaw(handler: RouteHandler, method: string, options: CallOptions): Promise<Response> {
  actAs(options.as);
  return handler(buildRequest(method, options), { params: Promise.resolve(options.params ?? {}) });
}

/** Calls a route handler and returns status and parsed JSON. */
export async function call(handler: RouteHandler, method: string, options: CallOptions) {
  const res = await callRaw(handler, method, options);
  const text = await res.text();
  return { status: res.status, json: text ? JSON.parse(text) : null };
}

/** Calls a handler that answers NDJSON and returns every event line. */
export async function callEvents(handler: RouteHandler, method: string, options: CallOptions) {
  const res = await callRaw(handler, method, options);
  const text = await res.text();
  if (!res.headers.get("content-type")?.includes("ndjson"))
    return { status: res.status, events: [], json: text ? JSON.parse(text) : null };
  const events = text
    .split("\n")
    .filter(Boolean)
    .map((line) => JSON.parse(line));
  return { status: res.status, events, json: null, last: events.at(-1) };
}
