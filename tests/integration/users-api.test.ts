import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { call } from "./support/call";
import { auditCount, makeFirm, makeUser } from "./support/factory";
import * as users from "@/app/api/users/route";
import * as user from "@/app/api/users/[userId]/route";
import * as password from "@/app/api/users/[userId]/password/route";
import * as invitation from "@/app/api/invitations/[token]/route";
import { addressedTo, clearInbox, waitForMessage } from "./support/inbox";
import { runMailWorkerDuringTests } from "./support/mail-worker";
import { verifyCredentials } from "@/lib/auth/verify-credentials";
import { SIGN_IN_LIMITS } from "@/lib/auth/rate-limit";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

let firm: number, admin: number, member: number;

beforeAll(async () => {
  firm = await makeFirm();
  admin = await makeUser(firm, "staff", { admin: true });
  member = await makeUser(firm, "senior");
});

afterAll(async () => {
  await getDb().destroy();
});
runMailWorkerDuringTests(); // after the afterAll above, so the worker stops before the pool is destroyed

describe("user administration", () => {
  it("lets an admin add a person, who is e-mailed a one-time link and chooses their own password (issue 19)", async () => {
    const r = await call(users.POST, "POST", {
      as: admin,
      body: { name: "Ada Quill", email: "ada@test.example", grade: "staff" },
    });
    expect(r.status).toBe(201);
    expect(r.json).toMatchObject({ user: { name: "Ada Quill", grade: "staff" }, invitationSent: true });
    expect(r.json.user).not.toHaveProperty("passwordHash");
    const audit = (await getDb()("audit_log")
      .where({ entity: "user", entity_id: String(r.json.user.id), action: "create" })
      .first())!;
    expect(JSON.stringify(audit.after_json)).not.toMatch(/password/i);
    // Nobody can sign in before Ada chooses her password: the stored hash is of a password nobody was told.
    await expect(
      verifyCredentials(getDb(), { email: "ada@test.example", password: "a long enough password" }, "10.0.0.5"),
    ).rejects.toThrow(/do not match/);
    const mail = await waitForMessage(addressedTo("ada@test.example"));
    expect(mail.subject).toMatch(/choose your Sondage password/);
    const token = /\/invitation\/([A-Za-z0-9_-]+)/.exec(mail.text)?.[1];
    expect(
      (
        await call(invitation.POST, "POST", {
          as: null,
          params: { token: token! },
          body: { password: "ada chooses this one" },
        })
      ).status,
    ).toBe(200);
    await expect(
      verifyCredentials(getDb(), { email: "ada@test.example", password: "ada chooses this one" }, "10.0.0.5"),
    ).resolves.toMatchObject({ id: r.json.user.id });
  });

  it("refuses a duplicate e-mail with 409 naming the field", async () => {
    const r = await call(users.POST, "POST", {
      as: admin,
      body: { name: "Ada Again", email: "ADA@test.example", grade: "staff" },
    });
    expect(r.status).toBe(409);
    expect(r.json.error.fields).toHaveProperty("email");
  });

  it("refuses a non-admin with 403", async () => {
    const r = await call(users.POST, "POST", {
      as: member,
      body: { name: "Nope", email: "nope@test.example", grade: "staff" },
    });
    expect(r.status).toBe(403);
  });

  it("resets a password by link: the old one stops working, earlier links are withdrawn, the new link sets it (issue 19)", async () => {
    const target = await makeUser(firm, "staff");
    const email = (await getDb()("users").where({ id: target }).first("email"))!.email;
    await expect(
      verifyCredentials(getDb(), { email, password: "integration-pass-1" }, "10.0.0.6"),
    ).resolves.toMatchObject({ id: target });
    expect(
      (await call(password.POST, "POST", { as: member, params: { userId: String(target) }, body: {} })).status,
    ).toBe(403);
    expect(
      (await call(password.POST, "POST", { as: admin, params: { userId: String(target) }, body: {} })).json,
    ).toEqual({ invitationSent: true });
    const first = /\/invitation\/([A-Za-z0-9_-]+)/.exec(
      (await waitForMessage((m) => addressedTo(email)(m) && /new Sondage password/.test(m.subject))).text,
    )![1];
    await expect(verifyCredentials(getDb(), { email, password: "integration-pass-1" }, "10.0.0.6")).rejects.toThrow(
      /do not match/,
    );
    expect(await auditCount({ entity: "user", entity_id: String(target), action: "reset-password" })).toBe(1);
    await clearInbox();
    await call(password.POST, "POST", { as: admin, params: { userId: String(target) }, body: {} });
    const second = /\/invitation\/([A-Za-z0-9_-]+)/.exec((await waitForMessage(addressedTo(email))).text)![1];
    expect(
      (
        await call(invitation.POST, "POST", {
          as: null,
          params: { token: first },
          body: { password: "from the first link" },
        })
      ).status,
    ).toBe(404);
    expect(
      (
        await call(invitation.POST, "POST", {
          as: null,
          params: { token: second },
          body: { password: "brand new password 1" },
        })
      ).status,
    ).toBe(200);
    await expect(
      verifyCredentials(getDb(), { email, password: "brand new password 1" }, "10.0.0.6"),
    ).resolves.toMatchObject({ id: target });
  });

  it("deactivates a user, who then cannot sign in", async () => {
    const target = await makeUser(firm, "staff");
    const email = (await getDb()("users").where({ id: target }).first("email"))!.email;
    await expect(
      verifyCredentials(getDb(), { email, password: "integration-pass-1" }, "10.0.0.1"),
    ).resolves.toMatchObject({ id: target });
    const r = await call(user.PATCH, "PATCH", {
      as: admin,
      params: { userId: String(target) },
      body: { active: false },
    });
    expect(r.status).toBe(200);
    expect(r.json.user.active).toBe(false);
    await expect(verifyCredentials(getDb(), { email, password: "integration-pass-1" }, "10.0.0.1")).rejects.toThrow(
      /deactivated/,
    );
    expect(await auditCount({ entity: "user", entity_id: String(target), action: "update" })).toBe(1);
  });

  it("does not let an admin deactivate themself", async () => {
    const r = await call(user.PATCH, "PATCH", {
      as: admin,
      params: { userId: String(admin) },
      body: { active: false },
    });
    expect(r.status).toBe(409);
  });
});

describe("sign-in rate limit", () => {
  it(`locks an account after ${SIGN_IN_LIMITS.perAccount} failures, with a clear message, and logs each try`, async () => {
    const target = await makeUser(firm, "staff");
    const email = (await getDb()("users").where({ id: target }).first("email"))!.email;
    for (let i = 0; i < SIGN_IN_LIMITS.perAccount; i++) {
      await expect(verifyCredentials(getDb(), { email, password: "wrong" }, "10.0.0.2")).rejects.toThrow(
        /do not match/,
      );
    }
    await expect(verifyCredentials(getDb(), { email, password: "integration-pass-1" }, "10.0.0.2")).rejects.toThrow(
      /Too many failed sign-ins for this account/,
    );
    const logged = await getDb()("sign_in_attempts").where({ email }).count({ n: "*" }).first();
    expect(Number(logged?.n)).toBe(SIGN_IN_LIMITS.perAccount + 1);
  });

  it(`blocks a network address after ${SIGN_IN_LIMITS.perIp} failures across accounts`, async () => {
    for (let i = 0; i < SIGN_IN_LIMITS.perIp; i++) {
      await expect(
        verifyCredentials(getDb(), { email: `ghost${i}@test.example`, password: "x" }, "10.9.9.9"),
      ).rejects.toThrow();
    }
    const email = (await getDb()("users").where({ id: member }).first("email"))!.email;
    await expect(verifyCredentials(getDb(), { email, password: "integration-pass-1" }, "10.9.9.9")).rejects.toThrow(
      /this network address/,
    );
    await expect(
      verifyCredentials(getDb(), { email, password: "integration-pass-1" }, "10.9.9.10"),
    ).resolves.toMatchObject({ id: member });
  });
});
