import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import bcrypt from "bcryptjs";
import { getDb } from "@/db/knex";
import { call } from "./support/call";
import { auditCount, makeFirm, makeUser } from "./support/factory";
import * as users from "@/app/api/users/route";
import * as user from "@/app/api/users/[userId]/route";
import * as password from "@/app/api/users/[userId]/password/route";
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

describe("user administration", () => {
  it("lets an admin create a user with a bcrypt hash and an audit row (no password in it)", async () => {
    const r = await call(users.POST, "POST", { as: admin, body: { name: "Ada Quill", email: "ada@test.example", grade: "staff", password: "a long enough password" } });
    expect(r.status).toBe(201);
    expect(r.json.user).not.toHaveProperty("passwordHash");
    const row = await getDb()("users").where({ email: "ada@test.example" }).first();
    expect(await bcrypt.compare("a long enough password", row.password_hash)).toBe(true);
    const audit = await getDb()("audit_log").where({ entity: "user", entity_id: String(row.id), action: "create" }).first();
    expect(JSON.stringify(audit.after_json)).not.toMatch(/password/i);
  });

  it("refuses a duplicate e-mail with 409 naming the field", async () => {
    const r = await call(users.POST, "POST", { as: admin, body: { name: "Ada Again", email: "ADA@test.example", grade: "staff", password: "a long enough password" } });
    expect(r.status).toBe(409);
    expect(r.json.error.fields).toHaveProperty("email");
  });

  it("refuses a non-admin with 403", async () => {
    const r = await call(users.POST, "POST", { as: member, body: { name: "Nope", email: "nope@test.example", grade: "staff", password: "a long enough password" } });
    expect(r.status).toBe(403);
  });

  it("deactivates a user, who then cannot sign in", async () => {
    const target = await makeUser(firm, "staff");
    const email = (await getDb()("users").where({ id: target }).first("email")).email;
    await call(password.POST, "POST", { as: admin, params: { userId: String(target) }, body: { password: "brand new password 1" } });
    await expect(verifyCredentials(getDb(), { email, password: "brand new password 1" }, "10.0.0.1")).resolves.toMatchObject({ id: target });
    const r = await call(user.PATCH, "PATCH", { as: admin, params: { userId: String(target) }, body: { active: false } });
    expect(r.status).toBe(200);
    expect(r.json.user.active).toBe(false);
    await expect(verifyCredentials(getDb(), { email, password: "brand new password 1" }, "10.0.0.1")).rejects.toThrow(/deactivated/);
    expect(await auditCount({ entity: "user", entity_id: String(target), action: "update" })).toBe(1);
  });

  it("does not let an admin deactivate themself", async () => {
    const r = await call(user.PATCH, "PATCH", { as: admin, params: { userId: String(admin) }, body: { active: false } });
    expect(r.status).toBe(409);
  });
});

describe("sign-in rate limit", () => {
  it(`locks an account after ${SIGN_IN_LIMITS.perAccount} failures, with a clear message, and logs each try`, async () => {
    const target = await makeUser(firm, "staff");
    const email = (await getDb()("users").where({ id: target }).first("email")).email;
    for (let i = 0; i < SIGN_IN_LIMITS.perAccount; i++) {
      await expect(verifyCredentials(getDb(), { email, password: "wrong" }, "10.0.0.2")).rejects.toThrow(/do not match/);
    }
    await expect(verifyCredentials(getDb(), { email, password: "integration-pass-1" }, "10.0.0.2")).rejects.toThrow(/Too many failed sign-ins for this account/);
    const logged = await getDb()("sign_in_attempts").where({ email }).count({ n: "*" }).first();
    expect(Number(logged?.n)).toBe(SIGN_IN_LIMITS.perAccount + 1);
  });

  it(`blocks a network address after ${SIGN_IN_LIMITS.perIp} failures across accounts`, async () => {
    for (let i = 0; i < SIGN_IN_LIMITS.perIp; i++) {
      await expect(verifyCredentials(getDb(), { email: `ghost${i}@test.example`, password: "x" }, "10.9.9.9")).rejects.toThrow();
    }
    const email = (await getDb()("users").where({ id: member }).first("email")).email;
    await expect(verifyCredentials(getDb(), { email, password: "integration-pass-1" }, "10.9.9.9")).rejects.toThrow(/this network address/);
    await expect(verifyCredentials(getDb(), { email, password: "integration-pass-1" }, "10.9.9.10")).resolves.toMatchObject({ id: member });
  });
});
