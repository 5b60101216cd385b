import { beforeEach, describe, expect, it, vi } from "vitest";

// The database stand-in: what reading the user's sessions_valid_after does in each case.
const lookup = vi.hoisted(() => ({ result: (): Promise<unknown> => Promise.resolve({ sessions_valid_after: null }) }));
vi.mock("@/db/knex", () => ({ getDb: () => () => ({ where: () => ({ first: () => lookup.result() }) }) }));

const { authOptions, sessionState } = await import("@/lib/auth/options");

const lost = () =>
  Object.assign(new Error("Connection lost: The server closed the connection."), {
    code: "PROTOCOL_CONNECTION_LOST",
    fatal: true,
  });
const iat = Math.floor(Date.UTC(2026, 11, 3, 9) / 1000);

describe("sessionState (a session checked against a password reset)", () => {
  beforeEach(() => {
    lookup.result = () => Promise.resolve({ sessions_valid_after: null });
  });

  it("is valid without a reset, ended for a token issued before one", async () => {
    expect(await sessionState(7, iat)).toBe("valid");
    lookup.result = () => Promise.resolve({ sessions_valid_after: new Date(Date.UTC(2026, 11, 3, 10)) });
    expect(await sessionState(7, iat)).toBe("ended");
  });

  it("is unavailable, not ended, while the database cannot answer (a Galera writer failing over)", async () => {
    lookup.result = () => Promise.reject(lost());
    expect(await sessionState(7, iat)).toBe("unavailable");
  });

  it("lets any other error through (a programming error is not an outage)", async () => {
    lookup.result = () => Promise.reject(new TypeError("boom"));
    await expect(sessionState(7, iat)).rejects.toThrow("boom");
  });

  it("keeps the user in the token and marks the session during an outage, so the request answers 503 rather than signing them out", async () => {
    lookup.result = () => Promise.reject(lost());
    const { jwt, session } = authOptions.callbacks!;
    const token = await jwt!({ token: { uid: 7, iat }, user: undefined } as never);
    expect(token).toMatchObject({ uid: 7 });
    const s = await session!({ session: { user: { name: "Ada" }, expires: "" }, token: { uid: 7, iat } } as never);
    expect(s).toMatchObject({ databaseUnavailable: true });
    expect((s.user as { id?: number }).id).toBeUndefined();
  });
});
