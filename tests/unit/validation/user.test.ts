import { describe, expect, it } from "vitest";
import { CreateUserSchema, SignInSchema, UpdateUserSchema, passwordInput } from "@/lib/validation/user";

describe("CreateUserSchema", () => {
  const good = { name: "Ada Quill", email: " Ada.Quill@Example.COM ", grade: "senior" };
  it("lower-cases and trims the e-mail and defaults the firm role", () => {
    expect(CreateUserSchema.parse(good)).toEqual({ ...good, email: "ada.quill@example.com", firmRole: "member" });
  });
  it.each([
    ["email", { email: "not-an-email" }],
    ["grade", { grade: "director" }],
    ["name", { name: "A" }],
  ])("rejects a bad %s", (field, patch) => {
    const r = CreateUserSchema.safeParse({ ...good, ...patch });
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path[0])).toContain(field);
  });
});

describe("other user schemas", () => {
  it("a chosen password needs 12 characters", () => {
    expect(passwordInput.safeParse("12345678901").success).toBe(false);
    expect(passwordInput.safeParse("123456789012").success).toBe(true);
  });
  it("CreateUserSchema carries no password: the person chooses it with a link", () => {
    expect(
      CreateUserSchema.parse({
        name: "Ada Quill",
        email: "ada@example.com",
        grade: "staff",
        password: "typed by an admin",
      }),
    ).not.toHaveProperty("password");
  });
  it("UpdateUserSchema takes a deactivation", () =>
    expect(UpdateUserSchema.parse({ active: false })).toEqual({ active: false }));
  it("UpdateUserSchema refuses an empty change", () => expect(UpdateUserSchema.safeParse({}).success).toBe(false));
  it("SignInSchema asks for both fields", () => {
    const r = SignInSchema.safeParse({ email: "", password: "" });
    expect(r.error?.issues.map((i) => i.path[0]).sort()).toEqual(["email", "password"]);
  });
});
