/** Client-side JSON calls to our route handlers, with the server's error message kept for the UI. */
export class ApiError extends Error {
  constructor(readonly status: number, message: string, readonly fields?: Record<string, string[]>) {
    super(message);
  }
}

/** The error answer every route handler sends: `{ error: { code, message, fields? } }`. */
export interface ErrorAnswer {
  error?: { code?: string; message?: string; fields?: Record<string, string[]>; problems?: unknown };
}

/** The JSON body of a refused answer (an empty object when it has none or it is not JSON). */
export async function readErrorAnswer(res: Response): Promise<ErrorAnswer> {
  return (await res.json().catch(() => ({}))) as ErrorAnswer;
}

export async function api<T>(path: string, init: { method?: string; body?: unknown } = {}): Promise<T> {
  const res = await fetch(path, {
    method: init.method ?? (init.body === undefined ? "GET" : "POST"),
    headers: init.body === undefined ? undefined : { "content-type": "application/json" },
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
  });
  if (res.status === 204) return undefined as T;
  if (!res.ok) {
    const data = await readErrorAnswer(res);
    throw new ApiError(res.status, data.error?.message ?? `Request failed (${res.status})`, data.error?.fields);
  }
  return (await res.json().catch(() => ({}))) as T;
}
