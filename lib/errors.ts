import { z } from "zod";
import { EngineInputError } from "@/lib/sampling/errors";

/** An error the API answers with: its status, a stable code, a message for people, and field errors. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string[]>,
  ) {
    super(message);
    this.name = "AppError";
  }

  toResponse(): Response {
    return Response.json(
      { error: { code: this.code, message: this.message, fields: this.fields } },
      { status: this.status },
    );
  }
}

export const unauthorised = () => new AppError(401, "unauthorised", "Sign in to continue.");
export const notFound = (what = "Not found") => new AppError(404, "not_found", what);
export const forbidden = (message = "Your role does not allow this.") => new AppError(403, "forbidden", message);
export const conflict = (message: string) => new AppError(409, "conflict", message);

/** A zod failure as a 400 that names each failing field, e.g. "periodEnd: Invalid date". */
export function validationError(error: z.ZodError): AppError {
  const fields: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join(".") : "(body)";
    (fields[key] ??= []).push(issue.message);
  }
  const summary = Object.entries(fields)
    .map(([field, messages]) => `${field}: ${messages[0]}`)
    .join("; ");
  return new AppError(400, "invalid_input", `Invalid input — ${summary}`, fields);
}

// mysql2 codes meaning the database server cannot be reached or went away mid-request. Socket
// codes count only on mysql2's own fatal errors (an S3 or SMTP socket reset is not the database).
const DATABASE_DOWN_CODES = new Set([
  "PROTOCOL_CONNECTION_LOST",
  "ER_SERVER_SHUTDOWN",
  "ER_CON_COUNT_ERROR",
  "ER_SERVER_GONE_ERROR",
  "CR_SERVER_LOST",
  "CR_CONNECTION_ERROR",
]);
const SOCKET_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "EPIPE", "ETIMEDOUT", "EHOSTUNREACH"]);

/** True when an error says the database is unreachable (not that a query was wrong). */
export function isDatabaseUnavailable(err: unknown): boolean {
  for (let e: unknown = err, depth = 0; e && depth < 4; depth++) {
    const { code, fatal, name } = e as { code?: unknown; fatal?: unknown; name?: unknown };
    if (typeof code === "string" && (DATABASE_DOWN_CODES.has(code) || (fatal === true && SOCKET_CODES.has(code))))
      return true;
    if (name === "KnexTimeoutError") return true; // no connection could be had from the pool in time
    // A Galera node that is not in the primary component, or still catching up after a restart, answers 1047.
    if ((e as { errno?: unknown }).errno === 1047 && /WSREP/i.test(e instanceof Error ? e.message : "")) return true;
    const message = e instanceof Error ? e.message : "";
    if (
      /Connection lost: The server closed the connection|Can't add new command when connection is in closed state/.test(
        message,
      )
    )
      return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}

export const databaseUnavailable = () =>
  new AppError(
    503,
    "database_unavailable",
    "The database is not answering just now, so nothing was saved. Try again in a minute; if it goes on, tell your firm's administrator.",
  );

/** Turns anything thrown in a handler into a Response; unexpected errors are logged, never echoed. */
export function errorToResponse(err: unknown): Response {
  if (err instanceof AppError) return err.toResponse();
  const code = (err as { code?: unknown } | null)?.code;
  if (code === "ER_LOCK_DEADLOCK" || code === "ER_LOCK_WAIT_TIMEOUT") {
    return new AppError(
      409,
      "busy",
      "Someone else was saving a change to the same record at the same moment; nothing of yours was saved. Try again.",
    ).toResponse();
  }
  if (isDatabaseUnavailable(err)) {
    console.error("[sondage] database unavailable", (err as { code?: string }).code ?? (err as Error).message);
    return new Response(databaseUnavailable().toResponse().body, {
      status: 503,
      headers: { "content-type": "application/json", "retry-after": "30" },
    });
  }
  if (err instanceof z.ZodError) return validationError(err).toResponse();
  if (err instanceof EngineInputError) return engineInputError(err).toResponse();
  // Anything else, a TypeError or RangeError from our own code included, is a programming error.
  console.error("[sondage] unexpected error", err);
  return new AppError(500, "internal", "Something went wrong on our side; the error has been logged.").toResponse();
}

/**
 * Bad input in one field: a 400 whose message ("field: message") and `fields` both name it.
 * `fieldMessage` is the shorter text a form shows beside the field, when it differs from `message`.
 */
export function fieldError(field: string, message: string, fieldMessage = message): AppError {
  return new AppError(400, "invalid_input", `${field}: ${message}`, { [field]: [fieldMessage] });
}

/**
 * The engine's refusal of an input as a 400. The engine's message already starts with its field's
 * name; `field` files it under the caller's name for that input (e.g. `params.confidence`), and
 * `lead` says what could not be done.
 */
export function engineInputError(err: EngineInputError, o: { field?: string; lead?: string } = {}): AppError {
  const message = o.lead ? `${o.lead}: ${err.message}` : err.message;
  return new AppError(400, "invalid_input", message, { [o.field ?? err.field]: [err.message] });
}
