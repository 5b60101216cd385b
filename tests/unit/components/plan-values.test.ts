import { describe, expect, it } from "vitest";
import { defaultPlanValues, toRequest } from "@/components/samples/plan-values";

// The plan form sends only the parameters the chosen method uses (the same list the audit trail prints).
describe("toRequest", () => {
  it("drops another method's fields and turns percents into fractions", () => {
    const values = defaultPlanValues("15000.00", 3);
    const mus = toRequest(values).params as Record<string, unknown>;
    expect(Object.keys(mus).sort()).toEqual(
      ["confidence", "expectedMisstatement", "method", "sizingBasis", "tolerableMisstatement"].sort(),
    );
    expect(mus.confidence).toBe(0.95);

    const attribute = toRequest({
      ...values,
      params: {
        ...values.params,
        method: "attribute",
        attributeMode: "control-frequency",
        controlFrequency: "monthly",
      },
    });
    expect(attribute.params).toEqual({
      method: "attribute",
      attributeMode: "control-frequency",
      controlFrequency: "monthly",
    });
    expect(attribute.direction).toBe("both");
  });
});
