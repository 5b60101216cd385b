/**
 * The data contract of the signed-off sample workpaper (PDF). Plain serialisable data only, so the
 * same object can be stored as JSON beside the locked PDF and rendered again byte-for-byte.
 *
 * Conventions:
 * - Money: decimal strings in currency units with 2 places, minus sign for negatives ("1234.56",
 *   "-12.00"), as mysql2 returns DECIMAL. The renderer groups thousands and never does arithmetic
 *   on them in floating point.
 * - Rates and confidences: fractions as numbers (0.95). Factors (Poisson, z) as numbers.
 * - Times: ISO 8601 strings with a zone ("2026-12-02T14:05:00.000Z"); printed in UTC.
 * - Dates without a time (period end): "YYYY-MM-DD".
 * - Optional facts are `null`, never omitted, so a missing value is visible in review.
 */
import type { MethodRationaleBlock } from "@/lib/advisor/describe";
import type { RiskSizing } from "@/lib/samples/risk-sizing";
import type {
  EvaluationBlock,
  Estimator,
  Money,
  ComputedResult,
  StratifiedEstimator,
} from "@/lib/samples/evaluation-types";

export type { MethodRationaleBlock };
export type * from "@/lib/samples/evaluation-types";

export type IsoTime = string;

export type SampleMethod = "mus" | "random" | "systematic" | "stratified" | "attribute" | "nonstatistical";

export interface WorkpaperData {
  /** True until the workpaper is locked: every page carries the draft watermark and banner. */
  draft: boolean;
  workpaperReference: string;
  firmName: string;
  clientName: string;
  engagementName: string;
  /** Period end, "YYYY-MM-DD". */
  periodEnd: string;
  /** ISO 4217 code printed beside amount headings ("EUR"). */
  currency: string;
  generatedAt: IsoTime;
  /** The sample's own name ("Trade receivables — confirmation sample"). */
  sampleName: string;
  objective: ObjectiveBlock;
  population: PopulationBlock;
  plan: PlanBlock;
  /** The estimator advisor run kept with the plan as the rationale for the method, if any. */
  methodRationale: MethodRationaleBlock | null;
  selection: SelectionBlock;
  /** How the confidence (and assurance factor) were set: the two risks, the table cell and version, or an override. */
  sizing?: SizingBlock | null;
  /** Key items examined 100 % (threshold and chosen, with reasons); null when the plan has none. */
  keyItems?: KeyItemsBlock | null;
  /** Haphazard picks, with who picked each and when; null when the selection is seeded. */
  picks?: HaphazardPick[] | null;
  /** Misstatements marked anomalous, with justification and acceptance. */
  anomalies?: AnomalyRow[];
  items: WorkpaperItem[];
  /** Null while the sample has nothing to evaluate (a draft before the first result); the conclusion says why. */
  evaluation: EvaluationBlock | null;
  conclusion: ConclusionBlock;
  reviewNotes: ReviewNote[];
  signOffs: { preparer: SignOff | null; reviewer: SignOff | null };
  lock: LockInfo | null;
  auditTrail: AuditTrailRow[];
  /** The evidence index: every file attached to an item of the current draw (absent in older fixtures). */
  evidence?: EvidenceIndexRow[];
}

export interface EvidenceIndexRow {
  reference: string;
  fileName: string;
  sha256: string;
  uploadedBy: string;
  uploadedAt: IsoTime;
}

export interface ObjectiveBlock {
  /** The test objective in the auditor's words. */
  objective: string;
  /** The assertion tested ("Existence", "Accuracy and valuation"). */
  assertion: string;
  /** The direction of misstatement the test is designed for. */
  direction: "overstatement" | "understatement" | "both";
  /** What a misstatement (or deviation) is for this test, if stated. */
  misstatementDefinition: string | null;
}

export interface PopulationBlock {
  name: string;
  sourceFile: string;
  /** SHA-256 of the uploaded file, 64 hex digits. */
  sha256: string;
  uploadedBy: string;
  uploadedAt: IsoTime;
  itemCount: number;
  /** Sum of all book values, negatives included. */
  total: Money;
  reconciliation: {
    /** The control total agreed to (trial balance, ledger), or null when none was given. */
    controlTotal: Money | null;
    controlSource: string | null;
    /** total − controlTotal. */
    difference: Money | null;
    status: "agreed" | "explained" | "unreconciled" | "no-control-total";
    explanation: string | null;
  };
  /** Items kept out of the sampling frame (PPS frames hold positive book values only). */
  excluded: {
    zeroCount: number;
    negativeCount: number;
    negativeTotal: Money;
    /** How the excluded items are addressed ("tested separately in WP C-3.2"). */
    treatment: string | null;
  } | null;
  /** The frame actually sampled: count and total after exclusions. */
  frameCount: number;
  frameTotal: Money;
}

export interface PlanParameter {
  label: string;
  /** money: decimal string; rate: fraction as a string ("0.05"); count/text: printed as given. */
  kind: "money" | "rate" | "count" | "text";
  value: string;
}

export interface FormulaInput {
  symbol: string;
  meaning: string;
  kind: PlanParameter["kind"] | "factor";
  value: string;
}

export interface PlannedStratum {
  number: number;
  /** The book-value band ("0.01 – 5,000.00") or the auditor's label. */
  label: string;
  populationSize: number;
  bookValue: Money;
  sampleSize: number;
}

export interface PlanBlock {
  method: SampleMethod;
  /** Variables estimator, when the method evaluates by one (random, systematic, stratified). */
  estimator: Estimator | StratifiedEstimator | null;
  parameters: PlanParameter[];
  computedSize: number;
  chosenSize: number;
  /** Why the chosen size differs from the computed size; null when they agree. */
  sizeReason: string | null;
  formula: {
    /** The formula as printed ("n = ⌈BV · RF / (TM − EM · EF)⌉"). */
    text: string;
    inputs: FormulaInput[];
    /** The formula with the inputs substituted, ending in the result. */
    substituted: string | null;
    /** Where the formula comes from. */
    source: string;
  };
  /** MUS: the sampling interval and the top-stratum threshold (items at or above it examined 100%). */
  interval: Money | null;
  topStratumThreshold: Money | null;
  topStratum: { count: number; total: Money } | null;
  strata: PlannedStratum[] | null;
  /** Attribute plans: deviations the sample size allows. */
  allowedDeviations: number | null;
  warnings: string[];
}

/** How the plan's confidence and assurance factor were set: the plan's own record (lib/samples/risk-sizing.ts); tableVersion 0 = shipped defaults, from memory. */
export type SizingBlock = RiskSizing;

export interface KeyItemsBlock {
  threshold: Money | null;
  items: {
    reference: string;
    rowNumber: number;
    bookValue: Money;
    basis: "threshold" | "chosen";
    reason: string | null;
    misstatement: Money | null;
  }[];
  count: number;
  total: Money;
  remainder: { count: number; total: Money };
}

export interface HaphazardPick {
  reference: string;
  rowNumber: number;
  bookValue: Money;
  pickedBy: string | null;
  pickedAt: IsoTime | null;
}

export interface AnomalyRow {
  reference: string;
  misstatement: Money | null;
  justification: string;
  markedBy: string | null;
  markedAt: IsoTime | null;
  acceptedBy: string | null;
  acceptedAt: IsoTime | null;
  /** How the evaluation treated it ("excluded from the projection, added at its actual amount"). */
  treatment: string;
}

export interface SelectionBlock {
  seed: number;
  seedSource: "generated" | "entered" | "haphazard";
  algorithm: string;
  algorithmVersion: string;
  /** 1 for the first draw; higher after a redraw (the earlier draws stay in the audit trail). */
  drawVersion: number;
  drawnBy: string;
  drawnAt: IsoTime;
  populationSha256: string;
  /** SHA-256 of the selection (the ordered list of selected rows), 64 hex digits. */
  selectionSha256: string;
  /** MUS: the random start r in currency units. */
  randomStart: Money | null;
  reperform: {
    result: "matches" | "differs" | "not-checked";
    checkedAt: IsoTime | null;
    checkedBy: string | null;
    /** What differed, when it did. */
    detail: string | null;
  };
  /** The reproduction recipe, one printed line each (monospaced, kept verbatim). */
  recipe: string[];
}

export interface WorkpaperItem {
  /** 1-based order of selection. */
  selectionOrder: number;
  reference: string;
  description: string | null;
  /** Row number in the population file (header = row 1). */
  rowNumber: number;
  stratum: number | null;
  topStratum: boolean;
  /** MUS selection points that fell in this item, in currency units. */
  hitPoints: Money[];
  origin: "selection" | "extension" | "replacement" | "key-item" | "haphazard";
  bookValue: Money;
  auditedValue: Money | null;
  /** book − audited (overstatement positive); null until audited. */
  misstatement: Money | null;
  status: "not-started" | "done" | "not-auditable" | "void";
  cause: string | null;
  comment: string | null;
  /** Attribute samples: whether the control deviated, and how. */
  deviation: boolean | null;
  deviationNature: string | null;
}

export interface AuditorResponseLine {
  kind: string;
  /** The response in words ("Ask the client to adjust (amount)"). */
  label: string;
  /** Overstatement positive; null for responses without an amount. */
  amount: Money | null;
  note: string | null;
}

/** The computed result (labelled as computed by Sondage, with its rule) apart from the auditor's own conclusion. */
export interface ConclusionBlock {
  computed: ComputedResult;
  /** How items that could not be audited were treated, and the method's cautions. */
  notes: string[];
  /** The auditor's conclusion and response in their words; null while not yet written. */
  auditor: {
    conclusion: string;
    responses: AuditorResponseLine[];
    writtenBy: string;
    role: string;
    writtenAt: IsoTime;
  } | null;
}

export interface ReviewNote {
  number: number;
  text: string;
  raisedBy: string;
  raisedAt: IsoTime;
  answers: { text: string; by: string; at: IsoTime }[];
  clearedBy: string | null;
  clearedAt: IsoTime | null;
}

export interface SignOff {
  name: string;
  /** The person's role on the engagement ("Senior", "Manager"). */
  role: string;
  at: IsoTime;
}

export interface LockInfo {
  lockedBy: string;
  role: string;
  lockedAt: IsoTime;
}

export interface AuditTrailRow {
  at: IsoTime;
  who: string;
  /** What happened ("Audited value entered", "Sample drawn"). */
  action: string;
  /** What it happened to ("Item INV-10234"), or null for the sample itself. */
  subject: string | null;
  before: string | null;
  after: string | null;
}
