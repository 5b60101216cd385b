import { describe, expect, it } from "vitest";
import { aggregate, type RowInput } from "@/lib/misstatements/aggregate";
import { entryRow, sampleRows, type EntryInput } from "@/lib/misstatements/rows";
import type { SampleContribution } from "@/lib/misstatements/contribution";
import type { SummaryMateriality } from "@/lib/misstatements/types";

/*
 * Worked example, computed by hand (invented figures; the rules are AU-C 450 / ISA 450 ¶5, ¶11 and
 * SEC SAB 108's two approaches — from memory). Sign: positive = the recorded figure is overstated.
 *
 * Materiality: overall 100,000.00; performance 75,000.00; clearly trivial 2,000.00; approaching
 * above 75 % of performance materiality (common practice) = 56,250.00.
 *
 *  row                         amount      IS effect  BS effect  treatment
 *  S001 factual              3,000.00                            accumulated
 *  S001 projected beyond    27,500.00   (30,500.00 − 3,000.00; allowance 41,250.00)  accumulated
 *  S002 factual             −1,200.50                            corrected by the client: apart
 *  S002 projected beyond    −4,800.25   (−6,000.75 − (−1,200.50); allowance 9,000.10)  accumulated
 *  M001 factual              1,999.99                            |1,999.99| < 2,000.00: clearly trivial
 *  M002 judgemental         12,000.00   12,000.00  12,000.00     accumulated
 *  M003 factual             −2,000.00   −2,000.00  −2,000.00     not below the threshold: accumulated
 *  M004 prior period         9,000.00   −9,000.00       0.00     prior-year cut-off that reversed this year
 *  M005 prior period         5,000.00        0.00   5,000.00     prior-year accrual still in the closing balance
 *
 *  uncorrected current year = 3,000.00 + 27,500.00 − 4,800.25 + 12,000.00 − 2,000.00 = 35,699.75
 *    factual 1,000.00 · projected 22,699.75 · judgemental 12,000.00 · gross 49,300.25
 *  income-statement (rollover) approach = 35,699.75 − 9,000.00 = 26,699.75
 *  balance-sheet (iron curtain) approach = 35,699.75 + 5,000.00 = 40,699.75
 *  measure = max(26,699.75, 40,699.75) = 40,699.75 ≤ 56,250.00 → well within
 *  allowances 41,250.00 + 9,000.10 = 50,250.10; upper estimate 40,699.75 + 50,250.10 = 90,949.85 ≤ 100,000.00
 */
const M: SummaryMateriality = {
  overall: "100000.00",
  performance: "75000.00",
  clearlyTrivial: "2000.00",
  approachingShare: 0.75,
  currency: "USD",
};

const contribution = (id: number, factual: string, projectedTotal: string, allowance: string): SampleContribution => ({
  sampleId: id,
  name: `Sample ${id}`,
  account: "Receivables",
  assertion: "Existence",
  direction: "overstatement",
  method: "mus",
  state: "contributes",
  reason: null,
  factual,
  projectedTotal,
  allowance,
  allowanceNote: null,
  upperLimit: null,
  confidence: 0.95,
  basis: "monetary-unit (Stringer bound)",
  complete: true,
  lockedAt: null,
});
const entry = (id: number, kind: EntryInput["kind"], amount: string, income: string, balance: string): EntryInput => ({
  id,
  kind,
  account: "Accruals",
  assertion: "Accuracy",
  description: `Entry ${id}`,
  amount,
  incomeEffect: income,
  balanceEffect: balance,
  corrected: null,
  evidenceCount: 0,
});

function exampleRows(): RowInput[] {
  return [
    ...sampleRows(contribution(1, "3000.00", "30500.00", "41250.00"), [], 7, false),
    ...sampleRows(
      contribution(2, "-1200.50", "-6000.75", "9000.10"),
      [{ sampleId: 2, part: "factual", on: "2026-10-15", reference: "AJE 14" }],
      7,
      false,
    ),
    entryRow(entry(1, "factual", "1999.99", "1999.99", "1999.99"), 7),
    entryRow(entry(2, "judgemental", "12000.00", "12000.00", "12000.00"), 7),
    entryRow(entry(3, "factual", "-2000.00", "-2000.00", "-2000.00"), 7),
    entryRow(entry(4, "prior-period", "9000.00", "-9000.00", "0.00"), 7),
    entryRow(entry(5, "prior-period", "5000.00", "0.00", "5000.00"), 7),
  ];
}

describe("summary of misstatements — the worked example", () => {
  const { rows, totals, status } = aggregate(exampleRows(), M);

  it("splits each sample into factual and projected-beyond rows, signed as overstatement positive", () => {
    expect(rows.find((r) => r.key === "s1-projected")?.amount).toBe("27500.00");
    expect(rows.find((r) => r.key === "s2-projected")?.amount).toBe("-4800.25");
    expect(rows.find((r) => r.key === "s1-factual")?.allowance).toBeNull();
    expect(rows.find((r) => r.key === "s1-projected")?.allowance).toBe("41250.00");
  });

  it("keeps corrected rows apart and lists clearly trivial entries without accumulating them", () => {
    expect(totals.corrected).toEqual({ total: "-1200.50", count: 1 });
    expect(totals.clearlyTrivial).toEqual({ total: "1999.99", count: 1 });
    expect(rows.find((r) => r.key === "e1")).toMatchObject({ clearlyTrivial: true, accumulated: false });
    expect(rows.find((r) => r.key === "e3")).toMatchObject({ clearlyTrivial: false, accumulated: true }); // exactly at the threshold is not below it
    expect(rows.find((r) => r.key === "s2-factual")).toMatchObject({ accumulated: false });
  });

  it("totals the uncorrected current-year misstatement by kind, exact to the cent", () => {
    expect(totals.uncorrected).toEqual({
      factual: "1000.00",
      judgemental: "12000.00",
      projected: "22699.75",
      currentYear: "35699.75",
      gross: "49300.25",
      count: 5,
    });
    expect(totals.entryEffects).toEqual({ income: "10000.00", balance: "10000.00" });
  });

  it("carries prior-period misstatements under each approach separately, never mixed", () => {
    expect(totals.incomeStatementApproach).toEqual({
      total: "26699.75",
      priorPeriod: "-9000.00",
      marginToPerformance: "48300.25",
      marginToOverall: "73300.25",
    });
    expect(totals.balanceSheetApproach).toEqual({
      total: "40699.75",
      priorPeriod: "5000.00",
      marginToPerformance: "34300.25",
      marginToOverall: "59300.25",
    });
  });

  it("sums the allowances conservatively and says they do not add linearly", () => {
    expect(totals.allowance.sum).toBe("50250.10");
    expect(totals.allowance.samples).toBe(2);
    expect(totals.allowance.note).toMatch(/do not add linearly/);
    expect(totals.upperEstimate).toBe("90949.85");
  });

  it("is well within: 40,699.75 against the 56,250.00 threshold", () => {
    expect(status).toMatchObject({
      level: "well-within",
      measure: "40699.75",
      threshold: "56250.00",
      responses: [],
      allowanceWarning: null,
    });
  });
});

describe("summary of misstatements — status as the total moves", () => {
  const withJudgement = (amount: string) =>
    aggregate([...exampleRows(), entryRow(entry(9, "judgemental", amount, amount, amount), 7)], M);

  it("approaching above 75 % of performance materiality, with the responses the standards expect", () => {
    // 40,699.75 + 16,000.00 = 56,699.75 > 56,250.00
    const { status } = withJudgement("16000.00");
    expect(status.level).toBe("approaching");
    expect(status.measure).toBe("56699.75");
    expect(status.responses.join(" ")).toMatch(/audit strategy and audit plan need to be revised/);
  });

  it("exactly at the threshold is still well within", () => {
    expect(withJudgement("15550.25").status.level).toBe("well-within"); // 40,699.75 + 15,550.25 = 56,250.00
  });

  it("exceeds performance, then overall materiality", () => {
    expect(withJudgement("34300.26").status.level).toBe("exceeds-performance"); // 75,000.01
    expect(withJudgement("59300.26").status.level).toBe("exceeds-overall"); // 100,000.01
  });

  it("warns when the conservative allowance takes the total past overall materiality", () => {
    // 40,699.75 + 10,000.00 + 50,250.10 = 100,949.85 > 100,000.00 while the status is still within
    const { status } = withJudgement("10000.00");
    expect(status.level).toBe("well-within");
    expect(status.allowanceWarning).toMatch(/could exceed overall materiality/);
  });

  it("uses the engagement's own share when the manager sets one", () => {
    const { status } = aggregate(exampleRows(), { ...M, approachingShare: 0.5 });
    expect(status).toMatchObject({
      level: "approaching",
      threshold: "37500.00",
      approachingShareSource: "set on this engagement",
    });
  });

  it("a corrected entry leaves every total", () => {
    const corrected = {
      ...entry(2, "judgemental", "12000.00", "12000.00", "12000.00"),
      corrected: { on: "2026-10-20", reference: "AJE 15" },
    };
    const rows = exampleRows().map((r) => (r.key === "e2" ? entryRow(corrected, 7) : r));
    const { totals } = aggregate(rows, M);
    expect(totals.uncorrected.currentYear).toBe("23699.75");
    expect(totals.corrected).toEqual({ total: "10799.50", count: 2 });
  });
});
