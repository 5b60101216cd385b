import "server-only";
import { AppError } from "@/lib/errors";
import { readCappedBody } from "@/lib/files/read-body";

/** The largest JSON body any route takes (the biggest real one, a sample plan, is a few kB). */
export const MAX_JSON_BODY_BYTES = 256 * 1024;
/** Deeper JSON than any schema of ours describes is refused before it reaches zod. */
export const MAX_JSON_DEPTH = 32;

const tooLarge = () =>
  new AppError(413, "body_too_large", `body: the request body is over ${MAX_JSON_BODY_BYTES / 1024} kB`, {
    body: ["Too large"],
  });

async function readCappedText(req: Request): Promise<string> {
  const body = await readCappedBody(req, MAX_JSON_BODY_BYTES, tooLarge);
  return body ? new TextDecoder("utf-8", { fatal: false }).decode(body) : "";
}

/** Nesting depth of a JSON text, counted on the brackets outside strings (no recursion). */
export function jsonDepth(text: string): number {
  let depth = 0,
    max = 0,
    inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (inString) {
      if (c === "\\") i++;
      else if (c === '"') inString = false;
    } else if (c === '"') inString = true;
    else if (c === "{" || c === "[") max = Math.max(max, ++depth);
    else if (c === "}" || c === "]") depth--;
  }
  return max;
}

/** The request's input: the query string for GET/DELETE, the JSON body otherwise (400 when malformed, 413 when too large). */
export async function readInput(req: Request): Promise<unknown> {
  if (req.method === "GET" || req.method === "HEAD" || req.method === "DELETE") {
    return Object.fromEntries(new URL(req.url).searchParams);
  }
  const text = await readCappedText(req);
  if (text.trim() === "") return {};
  if (jsonDepth(text) > MAX_JSON_DEPTH) {
    throw new AppError(400, "too_deep", `body: JSON nested deeper than ${MAX_JSON_DEPTH} levels`, {
      body: ["Nested too deeply"],
    });
  }
  try {
    return JSON.parse(text);
  } catch {
    throw new AppError(400, "malformed_json", "body: the request body is not valid JSON", { body: ["Not valid JSON"] });
  }
}
