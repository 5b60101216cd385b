import { describe, expect, it } from "vitest";
import { AddMemberSchema, CreateEngagementSchema, UpdateEngagementSchema } from "@/lib/validation/engagement";

const good = {
  clientName: "Kestrel Ridge Cooperative",
  name: "Year-end audit",
  periodEnd: "2026-12-31",
  currency: "usd",
  overallMateriality: "250,000",
  performanceMateriality: 187500.5,
};

function fieldErrors(input: unknown) {
  const r = CreateEngagementSchema.safeParse(input);
  return r.success ? {} : Object.fromEntries(r.error.issues.map((i) => [i.path.join("."), i.message]));
}

describe("CreateEngagementSchema", () => {
  it("normalises a good engagement: currency upper-cased, amounts as 2-decimal strings", () => {
    expect(CreateEngagementSchema.parse(good)).toEqual({
      ...good,
      currency: "USD",
      overallMateriality: "250000.00",
      performanceMateriality: "187500.5",
    });
  });

  it("keeps amounts exact as decimal strings, never floats", () => {
    const r = CreateEngagementSchema.parse({
      ...good,
      overallMateriality: "9007199254740993.01",
      performanceMateriality: "0.10",
    });
    expect(r.overallMateriality).toBe("9007199254740993.01");
  });

  it.each([
    ["clientName", { clientName: "" }, "Client name needs at least 2 characters"],
    ["periodEnd", { periodEnd: "31/12/2026" }, "Use the date form YYYY-MM-DD"],
    ["periodEnd", { periodEnd: "2026-02-30" }, "Not a real date"],
    ["currency", { currency: "dollars" }, "Use a 3-letter ISO 4217 code such as USD"],
    ["overallMateriality", { overallMateriality: "12.345" }, "at most 2 decimals"],
    ["overallMateriality", { overallMateriality: "-5" }, "Enter an amount"],
    [
      "performanceMateriality",
      { performanceMateriality: "300000" },
      "Performance materiality cannot exceed overall materiality",
    ],
  ])("rejects a bad %s", (field, patch, message) => {
    expect(fieldErrors({ ...good, ...patch })[field]).toContain(message);
  });

  it("names every missing field", () => {
    expect(Object.keys(fieldErrors({})).sort()).toEqual([
      "clientName",
      "currency",
      "name",
      "overallMateriality",
      "performanceMateriality",
      "periodEnd",
    ]);
  });
});

describe("UpdateEngagementSchema", () => {
  it("accepts a partial change", () =>
    expect(UpdateEngagementSchema.parse({ status: "fieldwork" })).toEqual({ status: "fieldwork" }));
  it("rejects an empty change", () => expect(UpdateEngagementSchema.safeParse({}).success).toBe(false));
  it("rejects an unknown status", () =>
    expect(UpdateEngagementSchema.safeParse({ status: "done" }).success).toBe(false));
});

describe("AddMemberSchema", () => {
  it("coerces a user id from a form string", () =>
    expect(AddMemberSchema.parse({ userId: "12", role: "staff" })).toEqual({ userId: 12, role: "staff" }));
  it("rejects a role outside the ladder", () => {
    const r = AddMemberSchema.safeParse({ userId: 1, role: "admin" });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].path).toEqual(["role"]);
  });
});
