import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { formatCents, parseAmountToCents, type NumberFormat } from "@/lib/imports/amount";
import { detectNumberFormat, numberToPlainDecimal } from "@/lib/imports/number-format";

const cents = (raw: string, format: NumberFormat = "dot-decimal") => {
  const result = parseAmountToCents(raw, format);
  return result.ok ? result.cents : result.kind;
};

// Amount notations seen in ledger exports: common practice.
describe("parseAmountToCents", () => {
  it.each([
    ["1,234.56", "dot-decimal", 123456n],
    ["1234.56", "dot-decimal", 123456n],
    ["1.234,56", "comma-decimal", 123456n],
    ["1234,56", "comma-decimal", 123456n],
    ["(1,234.56)", "dot-decimal", -123456n],
    ["-1234.56", "dot-decimal", -123456n],
    ["1234.56-", "dot-decimal", -123456n],
    ["$1,234.56", "dot-decimal", 123456n],
    ["-$1,234.56", "dot-decimal", -123456n],
    ["$-1,234.56", "dot-decimal", -123456n],
    ["($1,234.56)", "dot-decimal", -123456n],
    ["€ 1.234,56", "comma-decimal", 123456n],
    ["1.234,56 €", "comma-decimal", 123456n],
    ["£12.00", "dot-decimal", 1200n],
    ["USD 1,234.56", "dot-decimal", 123456n],
    ["1 234,56 EUR", "comma-decimal", 123456n],
    ["1\u00a0234,56", "comma-decimal", 123456n],
    ["1\u202f234.56", "dot-decimal", 123456n],
    ["12", "dot-decimal", 1200n],
    ["12.5", "dot-decimal", 1250n],
    [".5", "dot-decimal", 50n],
    ["0.00", "dot-decimal", 0n],
    ["-0.00", "dot-decimal", 0n],
    ["+7.01", "dot-decimal", 701n],
    ["12.3400", "dot-decimal", 1234n],
    ["9999999999999999.99", "dot-decimal", 999999999999999999n],
    ["-9,999,999,999,999,999.99", "dot-decimal", -999999999999999999n],
  ] as const)("%s (%s) → %s cents", (raw, format, expected) => {
    expect(cents(raw, format)).toBe(expected);
  });

  it("keeps every cent of a value beyond 2^53 cents, which a float would round", () => {
    // 2^53 = 9007199254740992; as a double 90071992547409.93 is not representable exactly.
    expect(cents("90071992547409.93")).toBe(9007199254740993n);
  });

  it.each([
    ["12.345", "too-many-decimals"],
    ["1,234.5678", "too-many-decimals"],
    ["10000000000000000.00", "out-of-range"],
    ["abc", "not-a-number"],
    ['=HYPERLINK("http://x","1")', "not-a-number"],
    ["=1+2", "not-a-number"],
    ["@SUM(A1)", "not-a-number"],
    ["-foo", "not-a-number"],
    ["1.234,56", "not-a-number"],
    ["12,34", "not-a-number"],
    ["--5", "not-a-number"],
    ["-(5)", "not-a-number"],
    ["1.2E+05", "not-a-number"],
    ["INV123", "not-a-number"],
    ["-", "not-a-number"],
    ["", "blank"],
    ["   ", "blank"],
  ])("refuses %s as %s", (raw, kind) => {
    expect(cents(raw)).toBe(kind);
  });

  it("names the decimal places it refuses", () => {
    const result = parseAmountToCents("1.005", "dot-decimal");
    expect(result).toEqual({
      ok: false,
      kind: "too-many-decimals",
      detail: "has 3 decimal places; at most 2 are allowed",
    });
  });
});

describe("formatCents", () => {
  it.each([
    [123456n, "1234.56"],
    [-123456n, "-1234.56"],
    [5n, "0.05"],
    [-5n, "-0.05"],
    [0n, "0.00"],
    [999999999999999999n, "9999999999999999.99"],
  ])("%s → %s", (value, text) => {
    expect(formatCents(value)).toBe(text);
  });
});

describe("detectNumberFormat", () => {
  it("reads the last separator of a value with both as the decimal mark", () => {
    expect(detectNumberFormat(["1.234,56", "12,00", "7"])).toBe("comma-decimal");
    expect(detectNumberFormat(["1,234.56", "(12.00)"])).toBe("dot-decimal");
  });
  it("treats repeated separators as grouping and 1–2 trailing digits as decimals", () => {
    expect(detectNumberFormat(["1.234.567"])).toBe("comma-decimal");
    expect(detectNumberFormat(["12,5"])).toBe("comma-decimal");
  });
  it("returns null when nothing decides (integers, or 1,234 which reads both ways)", () => {
    expect(detectNumberFormat(["1,234", "12", "INV-9"])).toBeNull();
  });
});

describe("numberToPlainDecimal", () => {
  // Excel keeps 15 significant digits (Microsoft, "Excel specifications and limits").
  it.each([
    [1234.56, "1234.56"],
    [0.1 + 0.2, "0.3"],
    [-0.07, "-0.07"],
    [1e-7, "0.0000001"],
    [123456789012345, "123456789012345"],
    [1e17, "100000000000000000"],
    [0, "0"],
  ])("%s → %s", (value, text) => {
    expect(numberToPlainDecimal(value)).toBe(text);
  });

  // ECMA-262 Number.prototype.toPrecision(15) is the 15-significant-digit rounding; the plain text
  // must carry that very value, without an exponent or trailing zeros, for any finite double.
  it("writes the 15-digit rounding (toPrecision(15)) of any number plainly", () => {
    fc.assert(
      fc.property(
        fc.oneof(
          fc.double({ noNaN: true, noDefaultInfinity: true }),
          fc.integer({ min: -1e9, max: 1e9 }).map((cents) => cents / 100),
          fc.double({ min: -1e16, max: 1e16, noNaN: true }),
        ),
        (value) => {
          const text = numberToPlainDecimal(value)!;
          expect(text).toMatch(/^-?\d+(\.\d*[1-9])?$/);
          expect(Number(text)).toBe(Number(value.toPrecision(15)) || 0);
        },
      ),
      { numRuns: 5000 },
    );
  });
});
