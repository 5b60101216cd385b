import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  dateToIsoDate,
  detectDateOrder,
  excelSerialToIsoDate,
  isDateNumberFormat,
  parseDateText,
} from "@/lib/imports/dates";

describe("excelSerialToIsoDate", () => {
  // Microsoft Learn, "Date systems in Excel": 1900 system, serial 1 = 1 January 1900; Excel treats
  // 1900 as a leap year (serial 60 = 29 February 1900), so later serials count one extra day.
  it.each([
    [1, "1900-01-01"],
    [59, "1900-02-28"],
    [61, "1900-03-01"],
    [45292, "2024-01-01"],
    [45292.75, "2024-01-01"],
    [2958465, "9999-12-31"],
  ])("1900 system: serial %s → %s", (serial, iso) => {
    expect(excelSerialToIsoDate(serial)).toBe(iso);
  });
  it("refuses the non-existent 1900-02-29 (serial 60) and serials out of range", () => {
    expect(excelSerialToIsoDate(60)).toBeNull();
    expect(excelSerialToIsoDate(0)).toBeNull();
    expect(excelSerialToIsoDate(2958466)).toBeNull();
  });
  // Same source: in the 1904 system serial 0 = 1 January 1904, so a date's serial is 1,462 less.
  it("1904 system: serial 0 = 1904-01-01, 43830 = 2024-01-01", () => {
    expect(excelSerialToIsoDate(0, true)).toBe("1904-01-01");
    expect(excelSerialToIsoDate(45292 - 1462, true)).toBe("2024-01-01");
  });
});

describe("parseDateText", () => {
  it.each([
    ["2024-01-31", "day-first", "2024-01-31"],
    ["2024-1-5", "day-first", "2024-01-05"],
    ["2024-01-31T00:00:00Z", "day-first", "2024-01-31"],
    ["2024/01/31", "month-first", "2024-01-31"],
    ["31/01/2024", "day-first", "2024-01-31"],
    ["31.01.2024", "day-first", "2024-01-31"],
    ["01/31/2024", "month-first", "2024-01-31"],
    ["03/04/2024", "day-first", "2024-04-03"],
    ["03/04/2024", "month-first", "2024-03-04"],
    ["29/02/2024", "day-first", "2024-02-29"],
  ] as const)("%s (%s) → %s", (text, order, iso) => {
    expect(parseDateText(text, order)).toBe(iso);
  });
  it.each(["2024-02-30", "2023-02-29", "31/01/24", "13/13/2024", "yesterday", "2024-13-01"])("refuses %s", (text) => {
    expect(parseDateText(text, "day-first")).toBeNull();
  });
});

describe("detectDateOrder / isDateNumberFormat", () => {
  it("decides the order only from a part over 12", () => {
    expect(detectDateOrder(["01/02/2024", "25/02/2024"])).toBe("day-first");
    expect(detectDateOrder(["02/25/2024"])).toBe("month-first");
    expect(detectDateOrder(["01/02/2024", "2024-05-06"])).toBeNull();
  });
  it("recognises date formats but not number formats", () => {
    expect(isDateNumberFormat("yyyy-mm-dd")).toBe(true);
    expect(isDateNumberFormat("[$-409]d-mmm-yy;@")).toBe(true);
    expect(isDateNumberFormat("#,##0.00")).toBe(false);
    expect(isDateNumberFormat('"Day" 0')).toBe(false);
    expect(isDateNumberFormat("General")).toBe(false);
  });
});

describe("dateToIsoDate", () => {
  // ECMA-262 Date.prototype.toISOString gives the UTC calendar date; the time of day is dropped.
  it("gives the UTC calendar date of any instant, before 1970 and at the end of a day included", () => {
    expect(dateToIsoDate(new Date(Date.UTC(1969, 11, 31, 23, 59, 59, 999)))).toBe("1969-12-31");
    expect(dateToIsoDate(new Date(Date.UTC(2024, 1, 29, 0, 0, 0, 0)))).toBe("2024-02-29");
    expect(dateToIsoDate(new Date(Number.NaN))).toBeNull();
    fc.assert(
      fc.property(fc.integer({ min: Date.UTC(1900, 0, 1), max: Date.UTC(9999, 11, 31, 23, 59) }), (ms) => {
        expect(dateToIsoDate(new Date(ms))).toBe(new Date(ms).toISOString().slice(0, 10));
      }),
      { numRuns: 5000 },
    );
  });
});
