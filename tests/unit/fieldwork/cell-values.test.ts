import { describe, expect, it } from "vitest";
import { safeCellText, unescapeCellText } from "@/lib/fieldwork/cell-text";
import { readAmount, readText, readYesNo } from "@/lib/fieldwork/cell-values";

describe("safeCellText (OWASP 'CSV Injection': prefix = + - @ tab CR with an apostrophe)", () => {
  it.each(["=1+2", "+SUM(A1)", "-2+3", "@cmd", "\tx", "\rx"])("escapes %j and restores it", (text) => {
    expect(safeCellText(text)).toBe(`'${text}`);
    expect(unescapeCellText(safeCellText(text))).toBe(text);
  });

  it("leaves other text alone, including a typed apostrophe before ordinary text", () => {
    expect(safeCellText("Alder & Pike")).toBe("Alder & Pike");
    expect(unescapeCellText("'tis")).toBe("'tis");
    expect(safeCellText(null)).toBe("");
  });
});

describe("readAmount", () => {
  it("reads numbers and amount text exactly in cents", () => {
    expect(readAmount({ kind: "number", value: 1250.5 })).toEqual({ ok: true, value: "1250.50" });
    expect(readAmount({ kind: "number", value: 0.1 + 0.2 })).toEqual({ ok: true, value: "0.30" });
    expect(readAmount({ kind: "text", value: "1,250.5" })).toEqual({ ok: true, value: "1250.50" });
    expect(readAmount({ kind: "text", value: "(420.00)" })).toEqual({ ok: true, value: "-420.00" });
    expect(readAmount({ kind: "empty" })).toEqual({ ok: true, value: null });
  });

  it("refuses more than 2 decimals, text, formulas and dates with the reason", () => {
    expect(readAmount({ kind: "number", value: 100.005 })).toMatchObject({
      ok: false,
      reason: expect.stringMatching(/more than 2 decimals/),
    });
    expect(readAmount({ kind: "text", value: "about 3000" })).toMatchObject({
      ok: false,
      reason: expect.stringMatching(/^Text in an amount cell: "about 3000"/),
    });
    expect(readAmount({ kind: "formula", formula: "D2*0.9" })).toMatchObject({
      ok: false,
      reason: expect.stringMatching(/formula/),
    });
    expect(readAmount({ kind: "date", value: new Date("2026-12-31") })).toMatchObject({ ok: false });
  });
});

describe("readText and readYesNo", () => {
  it("keeps formula-looking text as text, refuses a real formula", () => {
    expect(readText({ kind: "text", value: '=HYPERLINK("x")' }, 100)).toEqual({ ok: true, value: '=HYPERLINK("x")' });
    expect(readText({ kind: "formula", formula: "A1" }, 100)).toMatchObject({ ok: false });
    expect(readText({ kind: "text", value: "x".repeat(101) }, 100)).toMatchObject({
      ok: false,
      reason: expect.stringMatching(/at most 100/),
    });
  });

  it("reads yes/no answers", () => {
    expect(readYesNo({ kind: "text", value: "Yes" })).toEqual({ ok: true, value: true });
    expect(readYesNo({ kind: "text", value: "n" })).toEqual({ ok: true, value: false });
    expect(readYesNo({ kind: "boolean", value: true })).toEqual({ ok: true, value: true });
    expect(readYesNo({ kind: "text", value: "maybe" })).toMatchObject({
      ok: false,
      reason: expect.stringMatching(/not in the list \(Yes, No\)/),
    });
  });
});
