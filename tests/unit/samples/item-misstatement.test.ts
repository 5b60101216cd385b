import { describe, expect, it } from "vitest";
import { itemMisstatement, unauditableAuditedValue } from "@/lib/samples/item-misstatement";
import { liveMisstatement } from "@/components/samples/result-values";

// An item the procedures cannot be applied to is treated as a misstatement (ISA 530 ¶12;
// from memory); "fully misstated in the direction tested" is the firm rule Sondage applies (common
// practice): audited 0 when overstatement is tested, an understatement of the whole book value when
// understatement is tested. Misstatement = book − audited, overstatement positive.
describe("an item's misstatement as the evaluation counts it", () => {
  it("counts an unauditable item as its whole book value when overstatement (or both) is tested", () => {
    expect(itemMisstatement("not-auditable", "1250.40", null, "overstatement")).toBe("1250.40");
    expect(itemMisstatement("not-auditable", "1250.40", null, "both")).toBe("1250.40");
    expect(unauditableAuditedValue("1250.40", "overstatement")).toBe("0.00");
  });

  it("counts it as minus its book value when understatement is tested (audited at twice the book value)", () => {
    expect(unauditableAuditedValue("1250.40", "understatement")).toBe("2500.80");
    expect(itemMisstatement("not-auditable", "1250.40", null, "understatement")).toBe("-1250.40");
    // A credit balance: audited book + |book| = 0, still an understatement of its size.
    expect(itemMisstatement("not-auditable", "-300.00", null, "understatement")).toBe("-300.00");
  });

  it("is book − audited, exact in cents, for an audited item whatever the direction", () => {
    expect(itemMisstatement("done", "0.30", "0.10", "understatement")).toBe("0.20");
    expect(itemMisstatement("done", "100.00", "120.00", "overstatement")).toBe("-20.00");
  });

  it("is null without a result", () => {
    expect(itemMisstatement("not-started", "100.00", null, "overstatement")).toBeNull();
    expect(itemMisstatement("done", "100.00", null, "overstatement")).toBeNull();
  });
});

describe("the grid's misstatement cell as the auditor types (liveMisstatement)", () => {
  it("shows what the evaluation counts for an unauditable item in an understatement test", () => {
    expect(liveMisstatement("4100.00", { status: "not-auditable", auditedValue: "" }, "understatement")).toBe(
      "-4100.00",
    );
    expect(liveMisstatement("4100.00", { status: "not-auditable", auditedValue: "" }, "overstatement")).toBe("4100.00");
  });

  it("follows the typed audited value, and shows nothing while it is not a usable amount", () => {
    expect(liveMisstatement("4100.00", { status: "done", auditedValue: "3690.00" }, "understatement")).toBe("410.00");
    expect(liveMisstatement("4100.00", { status: "done", auditedValue: "abc" }, "overstatement")).toBeNull();
    expect(liveMisstatement("4100.00", { status: "done", auditedValue: "" }, "overstatement")).toBeNull();
  });
});
