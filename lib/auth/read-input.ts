import "server-only";
import { AppError } from "@/lib/errors";

/** The request's input: the query string for GET/DELETE, the JSON body otherwise (400 when malformed). */
export async function readInput(req: Request): Promise<unknown> {
  if (req.method === "GET" || req.method === "HEAD" || req.method === "DELETE") {
    return Object.fromEntries(new URL(req.url).searchParams);
  }
  const text = await req.text();
  if (text.trim() === "") return {};
  try {
    return JSON.parse(text);
  } catch {
    throw new AppError(400, "malformed_json", "body: the request body is not valid JSON", { body: ["Not valid JSON"] });
  }
}
