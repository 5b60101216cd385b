/**
 * The aggregation behind the summary of misstatements (AU-C 450 / ISA 450 ¶5, ¶11; AS 2810): pure,
 * exact in integer cents. Sign convention: a positive amount overstates the recorded figure.
 *
 * - Corrected rows are listed apart and never accumulated.
 * - The team's current-year entries (factual, judgemental) whose |amount| is below the clearly
 *   trivial threshold are listed but not accumulated (AU-C 450 / ISA 450 application material on
 *   "clearly trivial"; paragraph numbers from memory). Sample rows are always accumulated.
 * - Prior-period uncorrected misstatements carried forward enter each approach with their own
 *   current-year effect: the income-statement ("rollover") approach adds their effect on this
 *   year's profit, the balance-sheet ("iron curtain") approach their effect on the closing net
 *   assets. The two totals are kept apart, never mixed (SEC Staff Accounting Bulletin No. 108
 *   asks for both; from memory).
 * - Status compares the larger of the two totals (absolute value) with performance materiality.
 */
import { abs, cents, dec, sum } from "./money-cents";
import type { ApproachTotal, RowKind, SummaryMateriality, SummaryRow, SummaryStatus, SummaryTotals } from "./types";

export type RowInput = Omit<SummaryRow, "clearlyTrivial" | "accumulated">;

export const DEFAULT_APPROACHING_SHARE = 0.75; // common practice

export const ALLOWANCE_NOTE =
  "The allowances for sampling risk are added here as a conservative figure. Allowances do not add linearly: each is an upper-bound margin at its own sample's confidence, and their sum overstates the combined sampling risk of the samples taken together. No combined (pooled) bound is computed: Sondage applies no pooling method it can cite, so the conservative sum is shown alone.";

export interface Aggregate {
  rows: SummaryRow[];
  totals: SummaryTotals;
  status: SummaryStatus;
}

const CURRENT_ENTRY_KINDS: RowKind[] = ["factual", "judgemental"];

/** Marks clearly trivial and accumulated rows. */
export function classifyRows(rows: RowInput[], clearlyTrivial: string): SummaryRow[] {
  const trivial = cents(clearlyTrivial);
  return rows.map((r) => {
    const isTrivial =
      r.source === "entry" &&
      CURRENT_ENTRY_KINDS.includes(r.kind) &&
      r.corrected === null &&
      abs(cents(r.amount)) < trivial;
    return {
      ...r,
      clearlyTrivial: isTrivial,
      accumulated: r.kind !== "prior-period" && r.corrected === null && !isTrivial,
    };
  });
}

function approach(current: bigint, prior: bigint, m: SummaryMateriality): ApproachTotal {
  const total = current + prior;
  return {
    total: dec(total),
    priorPeriod: dec(prior),
    marginToPerformance: dec(cents(m.performance) - abs(total)),
    marginToOverall: dec(cents(m.overall) - abs(total)),
  };
}

export function totalsOf(rows: SummaryRow[], m: SummaryMateriality): SummaryTotals {
  const acc = rows.filter((r) => r.accumulated);
  const ofKind = (k: RowKind) => sum(acc.filter((r) => r.kind === k).map((r) => cents(r.amount)));
  const current = sum(acc.map((r) => cents(r.amount)));
  const prior = rows.filter((r) => r.kind === "prior-period" && r.corrected === null);
  const priorIncome = sum(prior.map((r) => cents(r.incomeEffect ?? "0")));
  const priorBalance = sum(prior.map((r) => cents(r.balanceEffect ?? "0")));
  const corrected = rows.filter((r) => r.corrected !== null);
  const trivial = rows.filter((r) => r.clearlyTrivial);
  const entries = acc.filter((r) => r.source === "entry");
  const allowances = acc.filter((r) => r.allowance !== null);
  const allowanceSum = sum(allowances.map((r) => cents(r.allowance!)));
  const is = approach(current, priorIncome, m);
  const bs = approach(current, priorBalance, m);
  const larger = abs(cents(is.total)) > abs(cents(bs.total)) ? abs(cents(is.total)) : abs(cents(bs.total));
  return {
    uncorrected: {
      factual: dec(ofKind("factual")),
      judgemental: dec(ofKind("judgemental")),
      projected: dec(ofKind("projected")),
      currentYear: dec(current),
      gross: dec(sum(acc.map((r) => abs(cents(r.amount))))),
      count: acc.length,
    },
    corrected: { total: dec(sum(corrected.map((r) => cents(r.amount)))), count: corrected.length },
    clearlyTrivial: { total: dec(sum(trivial.map((r) => cents(r.amount)))), count: trivial.length },
    entryEffects: {
      income: dec(sum(entries.map((r) => cents(r.incomeEffect ?? "0")))),
      balance: dec(sum(entries.map((r) => cents(r.balanceEffect ?? "0")))),
    },
    incomeStatementApproach: is,
    balanceSheetApproach: bs,
    allowance: { sum: dec(allowanceSum), samples: allowances.length, note: ALLOWANCE_NOTE },
    upperEstimate: dec(larger + allowanceSum),
  };
}

const RESPONSES_APPROACHING = [
  "Determine whether the overall audit strategy and audit plan need to be revised: the misstatements found, with those that may remain undetected, could approach materiality (ISA 450 ¶6; AU-C 450.07 — paragraph numbers from memory).",
  "Consider further audit procedures, or larger samples, on the accounts where the misstatements arose, to lower the risk that undetected misstatement takes the total past materiality.",
  "Ask management to correct the misstatements accumulated so far, and to examine the accounts with projected misstatement so that the whole amount can be determined and corrected (ISA 450 ¶8–9).",
  "Prepare to communicate the uncorrected misstatements to those charged with governance, with their effect individually and in aggregate (ISA 450 ¶12–13).",
];

/** 42500.5 → "42,500.50" for the status words (the figures themselves stay exact decimal strings). */
const words = (c: bigint) => {
  const d = dec(c);
  const [whole, frac] = d.replace("-", "").split(".");
  return `${d.startsWith("-") ? "−" : ""}${whole.replace(/\B(?=(\d{3})+(?!\d))/g, ",")}.${frac}`;
};
const wordsOf = (v: string) => words(cents(v));

function formatShare(share: number) {
  return `${Math.round(share * 10000) / 100} %`;
}

export function statusOf(totals: SummaryTotals, m: SummaryMateriality): SummaryStatus {
  const a = abs(cents(totals.incomeStatementApproach.total));
  const b = abs(cents(totals.balanceSheetApproach.total));
  const measure = a > b ? a : b;
  const performance = cents(m.performance);
  const overall = cents(m.overall);
  // The share is held to 4 decimals (0.7500): scale by 10,000 to stay in integers.
  const threshold = (performance * BigInt(Math.round(m.approachingShare * 10000))) / 10000n;
  const share = formatShare(m.approachingShare);
  const base = {
    measure: dec(measure),
    threshold: dec(threshold),
    approachingShare: m.approachingShare,
    approachingShareSource:
      m.approachingShare === DEFAULT_APPROACHING_SHARE ? "default, common practice" : "set on this engagement",
  };
  const allowanceWarning =
    cents(totals.upperEstimate) > overall
      ? "With the conservative sum of the sampling allowances added, the uncorrected misstatement could exceed overall materiality: the risk that the financial statements are materially misstated may be unacceptably high."
      : null;
  if (measure > overall) {
    return {
      ...base,
      level: "exceeds-overall",
      label: "Exceeds overall materiality",
      words: `Uncorrected misstatement of ${words(measure)} exceeds overall materiality of ${wordsOf(m.overall)}. Unless corrected, the misstatements are material to the financial statements.`,
      responses: [
        RESPONSES_APPROACHING[2],
        "Evaluate the effect on the auditor's report if management declines to correct them (ISA 450 ¶11; ISA 705).",
        RESPONSES_APPROACHING[3],
      ],
      allowanceWarning,
    };
  }
  if (measure > performance) {
    return {
      ...base,
      level: "exceeds-performance",
      label: "Exceeds performance materiality",
      words: `Uncorrected misstatement of ${words(measure)} exceeds performance materiality of ${wordsOf(m.performance)} (overall materiality ${wordsOf(m.overall)}).`,
      responses: RESPONSES_APPROACHING,
      allowanceWarning,
    };
  }
  if (measure > threshold) {
    return {
      ...base,
      level: "approaching",
      label: "Approaching materiality",
      words: `Uncorrected misstatement of ${words(measure)} is above ${share} of performance materiality (${words(threshold)}) and approaching it.`,
      responses: RESPONSES_APPROACHING,
      allowanceWarning,
    };
  }
  return {
    ...base,
    level: "well-within",
    label: "Well within materiality",
    words: `Uncorrected misstatement of ${words(measure)} is at or below ${share} of performance materiality (${words(threshold)}).`,
    responses: [],
    allowanceWarning,
  };
}

/** Rows classified, totals and status: what the view model carries. */
export function aggregate(rows: RowInput[], m: SummaryMateriality): Aggregate {
  const classified = classifyRows(rows, m.clearlyTrivial);
  const totals = totalsOf(classified, m);
  return { rows: classified, totals, status: statusOf(totals, m) };
}
