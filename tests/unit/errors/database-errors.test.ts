import { describe, expect, it, vi } from "vitest";
import { errorToResponse, isDatabaseUnavailable } from "@/lib/errors";

// MariaDB error codes reference: 1047 ER_UNKNOWN_COM_ERROR, which a Galera node answers with
// "WSREP has not yet prepared node for application use" while it is outside the primary
// component or still joining; 1213 ER_LOCK_DEADLOCK (also a lost certification conflict);
// 1064 ER_PARSE_ERROR. mysql2 names a dropped connection PROTOCOL_CONNECTION_LOST.
const mysqlError = (message: string, errno: number, code: string, extra: Record<string, unknown> = {}) =>
  Object.assign(new Error(message), { errno, code, ...extra });

describe("database errors as answers", () => {
  it("a Galera node that is not ready is the database being unavailable: 503 with Retry-After", async () => {
    vi.spyOn(console, "error").mockImplementation(() => undefined);
    const err = mysqlError("WSREP has not yet prepared node for application use", 1047, "ER_UNKNOWN_COM_ERROR");
    expect(isDatabaseUnavailable(err)).toBe(true);
    const res = errorToResponse(err);
    expect(res.status).toBe(503);
    expect(res.headers.get("retry-after")).toBe("30");
    expect(((await res.json()) as { error: { code: string } }).error.code).toBe("database_unavailable");
  });

  it("the same errno without the WSREP text is not taken for an outage", () => {
    expect(isDatabaseUnavailable(mysqlError("Unknown command", 1047, "ER_UNKNOWN_COM_ERROR"))).toBe(false);
  });

  it("a connection dropped mid-request (the writer node killed) answers 503, wrapped or not", () => {
    vi.spyOn(console, "error").mockImplementation(() => undefined);
    const lost = mysqlError("Connection lost: The server closed the connection.", 0, "PROTOCOL_CONNECTION_LOST", {
      fatal: true,
    });
    expect(errorToResponse(lost).status).toBe(503);
    expect(errorToResponse(Object.assign(new Error("insert failed"), { cause: lost })).status).toBe(503);
  });

  it("a deadlock that outlived the retries answers 409 busy, a bad query 500 without its text", async () => {
    vi.spyOn(console, "error").mockImplementation(() => undefined);
    expect(
      errorToResponse(
        mysqlError("Deadlock found when trying to get lock; try restarting transaction", 1213, "ER_LOCK_DEADLOCK"),
      ).status,
    ).toBe(409);
    const res = errorToResponse(mysqlError("You have an error in your SQL syntax near 'FROM'", 1064, "ER_PARSE_ERROR"));
    expect(res.status).toBe(500);
    expect(JSON.stringify(await res.json())).not.toMatch(/SQL syntax/);
  });
});
