import { actAs } from "./session";

type RouteHandler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

export interface CallOptions { as: number | null; params?: Record<string, string>; body?: unknown; rawBody?: string; query?: Record<string, string> }

/** Calls a route handler the way Next does, as the given user, and returns status and parsed JSON. */
export async function call(handler: RouteHandler, method: string, { as, params = {}, body, rawBody, query }: CallOptions) {
  actAs(as);
  const url = new URL("http://127.0.0.1/api/test");
  for (const [k, v] of Object.entries(query ?? {})) url.searchParams.set(k, v);
  const init: RequestInit = { method };
  if (rawBody !== undefined || body !== undefined) {
    init.body = rawBody ?? JSON.stringify(body);
    init.headers = { "content-type": "application/json" };
  }
  const res = await handler(new Request(url, init), { params: Promise.resolve(params) });
  const text = await res.text();
  return { status: res.status, json: text ? JSON.parse(text) : null };
}
