import { describe, expect, it } from "vitest";
import { formatDate, formatMoney, formatRate, formatTime } from "@/templates/workpaper/format";

describe("workpaper formatting", () => {
  it("groups thousands on the decimal text, with a true minus sign", () => {
    expect(formatMoney("1234.56")).toBe("1,234.56");
    expect(formatMoney("-1234.5")).toBe("\u22121,234.50");
    expect(formatMoney("1234567890123.45")).toBe("1,234,567,890,123.45");
    expect(formatMoney("0")).toBe("0.00");
    expect(formatMoney("-0.00")).toBe("0.00");
    expect(formatMoney(null)).toBe("—");
  });

  it("refuses what is not a decimal amount, naming it", () => {
    expect(() => formatMoney("12,50")).toThrow(/"12,50"/);
    expect(() => formatMoney("1e3")).toThrow(RangeError);
  });

  it("prints rates, UTC times and period dates", () => {
    expect(formatRate(0.0475)).toBe("4.75%");
    expect(formatRate(0.95, 0)).toBe("95%");
    expect(formatTime("2027-02-08T09:24:00.000Z")).toBe("2027-02-08 09:24 UTC");
    expect(formatTime("2027-02-08T10:24:00+01:00")).toBe("2027-02-08 09:24 UTC");
    expect(formatDate("2026-12-31")).toBe("31 December 2026");
  });
});
