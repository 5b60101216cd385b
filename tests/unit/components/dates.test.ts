import { describe, expect, it } from "vitest";
import { formatDate, formatDateTime } from "@/lib/format/dates";

// The instants are fixed in UTC (ISO 8601 with "Z"), so the results do not depend on the machine's zone.
describe("the product's date format", () => {
  it("prints a calendar date as day, short month, year", () => {
    expect(formatDate("2026-09-30")).toBe("30 September 2026");
    expect(formatDate("2026-01-01T23:59:59.000Z")).toBe("1 January 2026");
  });

  it("prints an instant with the time and its zone", () => {
    expect(formatDateTime("2026-12-03T07:05:09.123Z")).toBe("3 December 2026 at 07:05 UTC");
    expect(formatDateTime(new Date(Date.UTC(2027, 1, 28, 23, 0)))).toBe("28 February 2027 at 23:00 UTC");
  });

  it("shows a dash for nothing, and refuses nonsense", () => {
    expect(formatDate(null)).toBe("—");
    expect(formatDateTime(undefined)).toBe("—");
    expect(() => formatDateTime("not a date")).toThrow(RangeError); // lib/format/date.ts refuses nonsense rather than hide it
  });
});
