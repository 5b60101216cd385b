import { describe, expect, it } from "vitest";
import { formatDate, formatDateTime } from "@/lib/format/date";
import {
  formatBytes,
  formatCount,
  formatFactor,
  formatMoney,
  formatPercent,
  formatRate,
  isNegative,
} from "@/lib/format/number";

describe("one formatting module (screens, workbook text, PDF and e-mail print alike)", () => {
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
    expect(formatDateTime("2027-02-08T09:24:00.000Z")).toBe("8 Feb 2027, 09:24 UTC");
    expect(formatDateTime("2027-02-08T10:24:00+01:00")).toBe("8 Feb 2027, 09:24 UTC"); // an offset is brought back to UTC
    expect(formatDate("2026-12-31")).toBe("31 Dec 2026");
  });

  it("is exact on decimal text beyond a float's 15–17 digits (Intl formats the string, not a double)", () => {
    expect(formatMoney("9007199254740993.01")).toBe("9,007,199,254,740,993.01"); // 2^53 + 1: not representable as a double
    expect(formatMoney(-12.5)).toBe("\u221212.50");
    expect(formatMoney("-1000")).toBe("\u22121,000.00");
    expect(isNegative("-0.00")).toBe(false);
    expect(isNegative("-0.01")).toBe(true);
  });

  it("prints counts, factors, percentages and sizes", () => {
    expect(formatCount(1000000)).toBe("1,000,000");
    expect(formatFactor(-1.6448536)).toBe("\u22121.6449");
    expect(formatPercent(0.95)).toBe("95%");
    expect(formatPercent(0.0125)).toBe("1.25%");
    expect(formatPercent(0.025)).toBe("2.5%");
    expect(formatBytes(1536)).toBe("1.5 KB");
    expect(formatBytes(5 * 1024 * 1024)).toBe("5.0 MB");
  });

  it("has one style for dates and one for instants, whatever name an older caller uses", () => {
    expect(formatDateTime("2026-12-02T09:05:00Z")).toBe("2 Dec 2026, 09:05 UTC");
    for (const older of [formatDateTime, formatDateTime])
      expect(older("2026-12-02T09:05:00Z")).toBe(formatDateTime("2026-12-02T09:05:00Z"));
    expect(formatDate("2026-12-31")).toBe(formatDate("2026-12-31"));
  });

  it("prints calendar days without a time-zone shift, every month by the same hand-written abbreviation", () => {
    expect(formatDate("2026-01-01")).toBe("1 Jan 2026");
    expect(formatDate("2026-09-30")).toBe("30 Sep 2026"); // not ICU's en-GB "Sept", which differs between Node and browsers
    expect(formatDate("2026-12-31T23:59:59.999Z")).toBe("31 Dec 2026");
    expect(
      ["01", "02", "03", "04", "05", "06", "07", "08", "09", "10", "11", "12"].map(
        (m) => formatDate(`2027-${m}-15`).split(" ")[1],
      ),
    ).toEqual(["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"]);
  });

  it("shows a dash for nothing, and refuses what is not a date, naming it", () => {
    expect(formatDate(null)).toBe("—");
    expect(formatDateTime(undefined)).toBe("—");
    expect(formatDateTime("")).toBe("—");
    expect(() => formatDate("31/12/2026")).toThrow(/31\/12\/2026/);
    expect(() => formatDateTime("soon", "lockedAt")).toThrow(/lockedAt: not a date/);
  });
});
