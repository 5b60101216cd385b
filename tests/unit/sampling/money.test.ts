import { describe, expect, it } from "vitest";
import { addCents, fromCents, toCents } from "@/lib/sampling/money";

describe("money in integer cents", () => {
  it("converts amounts with float noise to exact cents", () => {
    // 0.1 + 0.2 = 0.30000000000000004 in IEEE 754 doubles: still 30 cents.
    expect(toCents("x", 0.1 + 0.2)).toBe(30);
    expect(toCents("x", 1234.56)).toBe(123456);
    expect(toCents("x", -420)).toBe(-42000);
    expect(fromCents(123456)).toBe(1234.56);
  });
  it("sums 10,000 × 0.10 to exactly 1,000.00 where floating point drifts", () => {
    let float = 0;
    let cents = 0;
    for (let i = 0; i < 10000; i++) {
      float += 0.1;
      cents = addCents("x", cents, toCents("x", 0.1));
    }
    expect(float).not.toBe(1000);
    expect(fromCents(cents)).toBe(1000);
  });
  it("rejects more than 2 decimals, naming the field", () =>
    expect(() => toCents("bookValues[4]", 10.005)).toThrow(/bookValues\[4\] must have at most 2 decimals/));
  it("rejects amounts beyond the exact range", () => expect(() => toCents("x", 1e17)).toThrow(/too large/));
  it("rejects a total beyond the exact range", () =>
    expect(() => addCents("total", Number.MAX_SAFE_INTEGER, 1)).toThrow(/exact range/));
  it("rejects NaN and strings with a TypeError", () => {
    expect(() => toCents("x", Number.NaN)).toThrow(TypeError);
    expect(() => toCents("x", "12.00")).toThrow(TypeError);
  });
});
