/**
 * The client's one way to call our route handlers: `apiFetch` for every write (JSON or a raw file
 * body) and, through `useApi` (components/ui/use-api.ts), for every read; `apiStream` opens the
 * NDJSON streams that `readNdjson` then reads. A refusal becomes an `ApiError` carrying the
 * server's `{ error: { code, message, fields? } }`.
 */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fields?: Record<string, string[]>,
    readonly code?: string,
    readonly problems?: unknown,
  ) {
    super(message);
  }
}

/** A refusal in plain words: a field's own message rather than "Invalid input — answer: …". */
export const plainMessage = (err: unknown): string =>
  err instanceof ApiError && err.fields ? (Object.values(err.fields)[0]?.[0] ?? err.message) : (err as Error).message;

/** The error answer every route handler sends: `{ error: { code, message, fields? } }`. */
export interface ErrorAnswer {
  error?: { code?: string; message?: string; fields?: Record<string, string[]>; problems?: unknown };
}

/** The JSON body of a refused answer (an empty object when it has none or it is not JSON). */
export async function readErrorAnswer(res: Response): Promise<ErrorAnswer> {
  return (await res.json().catch(() => ({}))) as ErrorAnswer;
}

async function toApiError(res: Response): Promise<ApiError> {
  const { error } = await readErrorAnswer(res);
  return new ApiError(
    res.status,
    error?.message ?? `Request failed (${res.status})`,
    error?.fields,
    error?.code,
    error?.problems,
  );
}

export interface ApiInit {
  method?: string;
  /** JSON-encoded, or sent as it is when it is a file (the upload routes read the raw body). */
  body?: unknown;
  signal?: AbortSignal;
}

function request(path: string, { method, body, signal }: ApiInit): Promise<Response> {
  const raw = body instanceof Blob;
  return fetch(path, {
    method: method ?? (body === undefined ? "GET" : "POST"),
    headers: body === undefined || raw ? undefined : { "content-type": "application/json" },
    body: body === undefined ? undefined : raw ? body : JSON.stringify(body),
    signal,
  });
}

/** Calls a route handler and answers its JSON (undefined for 204); throws `ApiError` on a refusal. */
export async function apiFetch<T>(path: string, init: ApiInit = {}): Promise<T> {
  const res = await request(path, init);
  if (res.status === 204) return undefined as T;
  if (!res.ok) throw await toApiError(res);
  return (await res.json().catch(() => ({}))) as T;
}

/** Opens a streamed (NDJSON) answer; throws `ApiError` when the server refuses before streaming. */
export async function apiStream(path: string, init: ApiInit = {}): Promise<ReadableStream<Uint8Array>> {
  const res = await request(path, init);
  if (!res.ok || !res.body) throw await toApiError(res);
  return res.body;
}

/** Adds `fileName` to an upload route's query, the way every upload route reads it. */
export function withFileName(url: string, file: File): string {
  return `${url}${url.includes("?") ? "&" : "?"}fileName=${encodeURIComponent(file.name)}`;
}
