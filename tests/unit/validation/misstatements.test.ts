import { describe, expect, it } from "vitest";
import { EntrySchema, SummarySettingsSchema } from "@/lib/validation/misstatements";

const base = {
  kind: "factual",
  account: "Accrued liabilities",
  assertion: "Completeness",
  description: "Unrecorded freight invoice",
  incomeEffect: "0",
  balanceEffect: "0",
};

describe("a misstatement entry's input", () => {
  it("keeps signed amounts as exact decimal strings, accepting a typographic minus and thousands separators", () => {
    expect(EntrySchema.parse({ ...base, amount: "\u22121,200.5" }).amount).toBe("-1200.5");
    expect(EntrySchema.parse({ ...base, amount: 18450 }).amount).toBe("18450.00");
    expect(EntrySchema.parse({ ...base, amount: "0.01" }).corrected).toBeNull();
  });

  it("refuses more than 2 decimals and names the field", () => {
    const r = EntrySchema.safeParse({ ...base, amount: "12.345" });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].path).toEqual(["amount"]);
  });

  it("needs a real date and a reference when corrected", () => {
    const r = EntrySchema.safeParse({ ...base, amount: "10", corrected: { on: "2026-02-30", reference: "" } });
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path.join("."))).toEqual(["corrected.on", "corrected.reference"]);
  });
});

describe("the summary's thresholds", () => {
  it("takes the approaching share as a fraction between 5 % and 100 %", () => {
    expect(SummarySettingsSchema.parse({ clearlyTrivial: "60000", approachingShare: "0.75" })).toEqual({
      clearlyTrivial: "60000.00",
      approachingShare: 0.75,
    });
    expect(SummarySettingsSchema.safeParse({ clearlyTrivial: "1", approachingShare: 75 }).success).toBe(false);
    expect(SummarySettingsSchema.safeParse({ clearlyTrivial: "-1", approachingShare: 0.5 }).success).toBe(false);
  });
});
