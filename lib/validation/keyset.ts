import { z } from "zod";

/**
 * Keyset ("seek") paging cursors, shared by the API and the grids that page through it.
 * A cursor names the last (or first) row a page showed by its sort value and its unique key, so
 * the next page starts right after it through the index — a deep page costs what the first does,
 * where OFFSET would walk every row before it.
 */
export type CursorValue = string | number;
export interface Cursor {
  value: CursorValue;
  key: number;
}

/** Opaque to callers: base64url of `[value, key]`. */
export function encodeCursor(cursor: Cursor): string {
  const json = JSON.stringify([cursor.value, cursor.key]);
  const bytes = new TextEncoder().encode(json);
  let binary = "";
  for (const b of bytes) binary += String.fromCharCode(b);
  return btoa(binary).replace(/\+/g, "-").replace(/\//g, "_").replace(/=+$/, "");
}

/** The cursor, or null when the text is not one this API wrote. */
export function decodeCursor(text: string): Cursor | null {
  try {
    const binary = atob(text.replace(/-/g, "+").replace(/_/g, "/"));
    const json = new TextDecoder().decode(Uint8Array.from(binary, (c) => c.charCodeAt(0)));
    const parsed: unknown = JSON.parse(json);
    if (!Array.isArray(parsed) || parsed.length !== 2) return null;
    const [value, key] = parsed as unknown[];
    if ((typeof value !== "string" && typeof value !== "number") || !Number.isSafeInteger(key) || (key as number) < 0)
      return null;
    if (typeof value === "string" && value.length > 300) return null;
    return { value, key: key as number };
  } catch {
    return null;
  }
}

/** A query-string field holding a cursor; refuses text that does not decode. */
export const cursorParam = z
  .string()
  .max(600)
  .transform((text, ctx) => {
    const cursor = decodeCursor(text);
    if (!cursor) {
      ctx.addIssue({ code: "custom", message: "Not a paging cursor from this API; start again from the first page" });
      return z.NEVER;
    }
    return cursor;
  });

/** `after` (the page following a row), `before` (the page preceding it) or `last` (the final page). */
export const keysetFields = {
  after: cursorParam.optional(),
  before: cursorParam.optional(),
  last: z
    .enum(["true", "false"])
    .optional()
    .transform((v) => v === "true"),
};

export interface KeysetPage<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
  /** Cursor for `after=` (the next page), or null on the last page. */
  nextCursor: string | null;
  /** Cursor for `before=` (the previous page), or null on the first page. */
  prevCursor: string | null;
}
