import { describe, expect, it } from "vitest";
import { assumeAuditedValues, createRng, observedTaintings } from "@/lib/sampling";

const rng = createRng(2026);
const BOOK = Array.from({ length: 20000 }, () => Math.round((10 + 5000 * rng.nextDouble() ** 2) * 100) / 100);
const cents = (v: number) => Math.round(v * 100);

describe("assumeAuditedValues", () => {
  it("misstates about the asked share of items (binomial: within 4 standard errors — common practice)", () => {
    const audited = assumeAuditedValues({
      bookValues: BOOK,
      seed: 7,
      scenario: { kind: "pattern", misstatedShare: 0.05, tainting: "spread", overstatementShare: 1 },
    });
    const misstated = audited.filter((a, i) => a !== BOOK[i]).length;
    const se = Math.sqrt(BOOK.length * 0.05 * 0.95);
    expect(Math.abs(misstated - 0.05 * BOOK.length)).toBeLessThan(4 * se);
  });

  it("keeps audited values in whole cents and overstatements between 0 and the book value", () => {
    const audited = assumeAuditedValues({
      bookValues: BOOK,
      seed: 3,
      scenario: { kind: "pattern", misstatedShare: 0.3, tainting: "mostly-small", overstatementShare: 1 },
    });
    audited.forEach((a, i) => {
      expect(Number.isInteger(Math.round(a * 100))).toBe(true);
      expect(Math.abs(a * 100 - cents(a))).toBeLessThan(1e-6);
      expect(a).toBeGreaterThanOrEqual(0);
      expect(a).toBeLessThanOrEqual(BOOK[i]);
    });
  });

  it("mostly-small taintings: about 90% of misstated items tainted at most 10% (Sondage's pattern)", () => {
    const audited = assumeAuditedValues({
      bookValues: BOOK,
      seed: 5,
      scenario: { kind: "pattern", misstatedShare: 0.5, tainting: "mostly-small", overstatementShare: 1 },
    });
    const t = audited.map((a, i) => (BOOK[i] - a) / BOOK[i]).filter((x) => x > 0);
    const small = t.filter((x) => x <= 0.1 + 1e-3).length / t.length;
    expect(small).toBeGreaterThan(0.88);
    expect(small).toBeLessThan(0.92);
    expect(Math.max(...t)).toBeLessThanOrEqual(1);
  });

  it("whole-amount overstatement sets audited values to zero; understatement doubles them", () => {
    expect(
      assumeAuditedValues({
        bookValues: [100, 250.5],
        seed: 1,
        scenario: { kind: "pattern", misstatedShare: 1, tainting: "whole-amount", overstatementShare: 1 },
      }),
    ).toEqual([0, 0]);
    expect(
      assumeAuditedValues({
        bookValues: [100, 250.5],
        seed: 1,
        scenario: { kind: "pattern", misstatedShare: 1, tainting: "whole-amount", overstatementShare: 0 },
      }),
    ).toEqual([200, 501]);
  });

  it("the over/understatement mix follows overstatementShare", () => {
    const audited = assumeAuditedValues({
      bookValues: BOOK,
      seed: 9,
      scenario: { kind: "pattern", misstatedShare: 1, tainting: "spread", overstatementShare: 0.25 },
    });
    const overShare = audited.filter((a, i) => a < BOOK[i]).length / BOOK.length;
    expect(Math.abs(overShare - 0.25)).toBeLessThan(4 * Math.sqrt((0.25 * 0.75) / BOOK.length));
  });

  it("observed taintings are reused with their sign", () => {
    const audited = assumeAuditedValues({
      bookValues: BOOK,
      seed: 11,
      scenario: { kind: "observed", misstatedShare: 1, taintings: [0.5, -0.25] },
    });
    const seen = new Set(audited.map((a, i) => Math.round(((BOOK[i] - a) / BOOK[i]) * 100) / 100));
    expect([...seen].sort()).toEqual([-0.25, 0.5]);
  });

  it("the same seed gives the same values; another seed others", () => {
    const s = { kind: "pattern", misstatedShare: 0.1, tainting: "spread", overstatementShare: 0.8 } as const;
    expect(assumeAuditedValues({ bookValues: BOOK, seed: 4, scenario: s })).toEqual(
      assumeAuditedValues({ bookValues: BOOK, seed: 4, scenario: s }),
    );
    expect(assumeAuditedValues({ bookValues: BOOK, seed: 5, scenario: s })).not.toEqual(
      assumeAuditedValues({ bookValues: BOOK, seed: 4, scenario: s }),
    );
  });

  it("rejects a share outside 0..1, naming the field", () => {
    expect(() =>
      assumeAuditedValues({
        bookValues: BOOK,
        seed: 1,
        scenario: { kind: "pattern", misstatedShare: 1.5, tainting: "spread", overstatementShare: 1 },
      }),
    ).toThrow(/scenario\.misstatedShare must be between 0 and 1/);
    expect(() =>
      assumeAuditedValues({
        bookValues: BOOK,
        seed: 1,
        scenario: { kind: "observed", misstatedShare: 0.2, taintings: [] },
      }),
    ).toThrow(/scenario\.taintings must hold at least one/);
    expect(() =>
      assumeAuditedValues({
        bookValues: [1.005],
        seed: 1,
        scenario: { kind: "observed", misstatedShare: 0, taintings: [] },
      }),
    ).toThrow(/bookValues\[0\]/);
  });
});

describe("observedTaintings", () => {
  it("takes (book − audited)/book of misstated items and their share", () => {
    expect(
      observedTaintings([
        { bookValue: 100, auditedValue: 80 },
        { bookValue: 50, auditedValue: 50 },
        { bookValue: 200, auditedValue: 250 },
        { bookValue: 0, auditedValue: 0 },
      ]),
    ).toEqual({ taintings: [0.2, -0.25], misstatedShare: 2 / 3 });
  });
});
