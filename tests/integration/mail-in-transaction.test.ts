import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { call } from "./support/call";
import { makeFirm, makeUser } from "./support/factory";
import * as users from "@/app/api/users/route";
import * as password from "@/app/api/users/[userId]/password/route";

// The write fails after its message was queued, inside its transaction (a lost connection before the commit).
const failure = vi.hoisted(() => ({ afterQueue: false }));
vi.mock("@/lib/mail/notify-people", async (importOriginal) => {
  const real = await importOriginal<typeof import("@/lib/mail/notify-people")>();
  return {
    ...real,
    notifyStaffInvitation: async (...args: Parameters<typeof real.notifyStaffInvitation>) => {
      const queued = await real.notifyStaffInvitation(...args);
      if (failure.afterQueue) throw new Error("connection lost before the commit");
      return queued;
    },
  };
});
vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let firm: number, admin: number;
const queuedFor = async (email: string) =>
  Number((await getDb()("mail_outbox").where({ to_email: email }).count({ n: "*" }).first())?.n);

beforeAll(async () => {
  firm = await makeFirm();
  admin = await makeUser(firm, "partner", { admin: true });
});

afterAll(async () => {
  failure.afterQueue = false;
  await getDb().destroy();
});

// Issue 17: the outbox row is written in the same transaction as the change that causes it (common practice: transactional outbox).
describe("the staff invitation is queued in the invitation's own transaction", () => {
  const invite = (email: string) =>
    call(users.POST, "POST", { as: admin, body: { name: "Noor Vale", email, grade: "staff" } });

  it("a committed invitation queues exactly one message", async () => {
    const r = await invite("noor.vale@tx.example");
    expect(r.status).toBe(201);
    expect(r.json).toMatchObject({ invitationSent: true });
    expect(await queuedFor("noor.vale@tx.example")).toBe(1);
  });

  it("a refused invitation (the address is taken) queues nothing more", async () => {
    const r = await invite("noor.vale@tx.example");
    expect(r.status).toBeGreaterThanOrEqual(400);
    expect(r.status).toBeLessThan(500);
    expect(await queuedFor("noor.vale@tx.example")).toBe(1);
  });

  it("an invitation whose transaction fails after queueing leaves neither the person nor the message", async () => {
    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    failure.afterQueue = true;
    try {
      const r = await invite("ines.marr@tx.example");
      expect(r.status).toBe(500);
    } finally {
      failure.afterQueue = false;
      errors.mockRestore();
    }
    expect(await getDb()("users").where({ email: "ines.marr@tx.example" }).first("id")).toBeUndefined();
    expect(await queuedFor("ines.marr@tx.example")).toBe(0);
  });
});

describe("the password-reset link is queued in the reset's own transaction", () => {
  it("a failed reset keeps the old state and queues nothing; a committed one queues exactly one", async () => {
    const person = await makeUser(firm, "senior");
    const before = (await getDb()("users").where({ id: person }).first("email", "password_hash"))!;
    const reset = () => call(password.POST, "POST", { as: admin, params: { userId: String(person) }, body: {} });

    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    failure.afterQueue = true;
    try {
      expect((await reset()).status).toBe(500);
    } finally {
      failure.afterQueue = false;
      errors.mockRestore();
    }
    expect((await getDb()("users").where({ id: person }).first("password_hash"))!.password_hash).toBe(
      before.password_hash,
    );
    expect(await queuedFor(before.email)).toBe(0);

    const ok = await reset();
    expect(ok.status).toBe(200);
    expect(ok.json).toEqual({ invitationSent: true });
    expect(await queuedFor(before.email)).toBe(1);
  });
});
