/**
 * The summary of misstatements' view model: the one object the page, the API, the workbook and the
 * PDF print. Money is a decimal string (exact cents); a positive amount OVERSTATES the recorded
 * figure (book − audited, the engine's convention), a negative one understates it.
 */
export type RowKind = "factual" | "judgemental" | "projected" | "prior-period";

export interface SummaryRow {
  key: string;
  source: "sample" | "entry";
  kind: RowKind;
  sampleId: number | null;
  entryId: number | null;
  /** Where the figure comes from (the sample's page or the entry on the summary). */
  link: string;
  reference: string;
  account: string;
  assertion: string;
  direction: string | null;
  description: string;
  /** Current-year misstatement of the account (prior-period rows: the amount carried forward, not accumulated). */
  amount: string;
  /** Effect on profit before tax / on net assets, positive = overstated; prior-period rows: the current-year effect under each approach. */
  incomeEffect: string | null;
  balanceEffect: string | null;
  /** Sampling allowance (upper limit − projected) of a projected row; null when the method gives none. */
  allowance: string | null;
  allowanceNote: string | null;
  corrected: { on: string; reference: string } | null;
  clearlyTrivial: boolean;
  /** Counts in the uncorrected current-year total. */
  accumulated: boolean;
  /** A locked sample's row, as it stood at the sample's lock. */
  frozen: boolean;
  evidenceCount: number;
}

export type StatusLevel = "well-within" | "approaching" | "exceeds-performance" | "exceeds-overall";

export interface ApproachTotal {
  /** Current-year uncorrected misstatement plus the prior-period effects under this approach. */
  total: string;
  priorPeriod: string;
  marginToPerformance: string;
  marginToOverall: string;
}

export interface SummaryTotals {
  uncorrected: {
    factual: string;
    judgemental: string;
    projected: string;
    currentYear: string;
    gross: string;
    count: number;
  };
  corrected: { total: string; count: number };
  clearlyTrivial: { total: string; count: number };
  entryEffects: { income: string; balance: string };
  incomeStatementApproach: ApproachTotal;
  balanceSheetApproach: ApproachTotal;
  allowance: { sum: string; samples: number; note: string };
  /** The larger of the two approaches' totals in absolute value plus the summed allowance. */
  upperEstimate: string;
}

export interface SummaryStatus {
  level: StatusLevel;
  label: string;
  words: string;
  measure: string;
  threshold: string;
  approachingShare: number;
  approachingShareSource: string;
  responses: string[];
  allowanceWarning: string | null;
}

export interface SummaryMateriality {
  overall: string;
  performance: string;
  clearlyTrivial: string;
  approachingShare: number;
  currency: string;
}

export interface SummarySampleLine {
  sampleId: number;
  reference: string;
  name: string;
  link: string;
  method: string;
  state: "contributes" | "no-results" | "not-monetary";
  reason: string | null;
  locked: boolean;
  frozen: boolean;
}

export interface SummaryEntryLine {
  id: number;
  version: number;
  reference: string;
  createdByName: string;
  createdAt: string;
  updatedAt: string | null;
}

export interface SummaryNote {
  id: number;
  text: string;
  status: "open" | "answered" | "cleared";
  raisedBy: string;
  raisedAt: string;
  answer: string | null;
  answeredBy: string | null;
  answeredAt: string | null;
  clearedBy: string | null;
  clearedAt: string | null;
}

export interface SummarySignOff {
  name: string;
  /** The role as people read it ("Senior"), from ROLE_LABELS. */
  role: string;
  at: string;
}

export interface SummaryReview {
  preparer: SummarySignOff | null;
  reviewer: SummarySignOff | null;
  /** Sign-offs given to rows that have changed since (a sample's results moved): shown as cleared. */
  staleSignOffs: boolean;
  lock: { name: string; at: string; workpaperSha256: string; workpaperBytes: number; reference: string } | null;
  openNotes: number;
  /** Why a reviewer cannot sign off now (the server's 409 in the same words), or null when they can. */
  reviewerBlocker: string | null;
  lockable: { ok: boolean; reasons: string[] };
}

export interface SummaryTrailEntry {
  at: string;
  who: string;
  action: string;
  subject: string;
  before: string | null;
  after: string | null;
}

export interface SummaryView {
  engagement: { id: number; clientName: string; name: string; periodEnd: string; currency: string };
  firmName: string;
  workpaperReference: string;
  generatedAt: string;
  materiality: SummaryMateriality;
  rows: SummaryRow[];
  totals: SummaryTotals;
  status: SummaryStatus;
  samples: SummarySampleLine[];
  entries: SummaryEntryLine[];
  review: SummaryReview;
  notes: SummaryNote[];
  /** Every recorded change to the summary, oldest first (the workpaper's appendix). */
  trail: SummaryTrailEntry[];
  rowsSha256: string;
  conventions: string[];
  caution: string;
}
