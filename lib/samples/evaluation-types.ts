/**
 * The evaluation view model's figures: one block per method, built once in lib/samples from the
 * engine's results and printed as they are by the sample page, `GET …/evaluation` and the PDF
 * workpaper (templates compute nothing). Money is a decimal string with 2 places ("1234.56").
 */
import type {
  ClassicalDistribution,
  Estimator,
  FactorMode,
  Sides,
  StratifiedEstimator,
  TestDirection,
} from "@/lib/sampling";

export type { Estimator, StratifiedEstimator };

export type Money = string;

/** One ranked tainting in a Stringer bound. */
export interface StringerRow {
  rank: number;
  reference: string;
  bookValue: Money;
  auditedValue: Money;
  /** Tainting as a positive fraction (0.2 = 20%). */
  tainting: number;
  /** RF(k) at the bound's confidence. */
  factor: number;
  /** RF(k) − RF(k−1), the factor increment (the incremental allowance uses it less 1). */
  factorIncrement: number;
  /** t_k · J. */
  projected: Money;
  /** (RF(k) − RF(k−1) − 1) · t_k · J. */
  incrementalAllowance: Money;
}

export interface StringerSide {
  /** RF(0) and RF(0) · J. */
  basicPrecisionFactor: number;
  basicPrecision: Money;
  rows: StringerRow[];
  /** Σ t_k · J over the rows (sample part of the projection). */
  projectedFromSample: Money;
  /** Top-stratum misstatement in this direction, at its actual amount. */
  topStratumMisstatement: Money;
  /** projectedFromSample + topStratumMisstatement. */
  projected: Money;
  incrementalAllowance: Money;
  upperLimit: Money;
}

export interface MusEvaluationBlock {
  method: "mus";
  confidence: number;
  interval: Money;
  factorMode: FactorMode;
  tolerableMisstatement: Money;
  sampleItems: number;
  topStratum: { count: number; bookValue: Money; auditedValue: Money };
  overstatement: StringerSide;
  understatement: StringerSide;
  mostLikelyMisstatement: Money;
  netUpperLimits: { overstatement: Money; understatement: Money };
  /** The direction(s) the plan tests. */
  direction: TestDirection;
  /** The firm's convention stamped on the plan: compare gross upper limits with TM, or net ones. */
  limits: "gross" | "net";
  /** The limits compared with TM under that convention, for the directions tested (null: not tested). */
  compared: { overstatement: Money | null; understatement: Money | null };
  supported: boolean;
  /** The comparison in words, with the convention named. */
  statement: string;
  /** Why an understatement test by monetary-unit sampling needs care; null when understatement is not tested. */
  understatementCaution: string | null;
  warnings: string[];
  formulaReferences: string[];
}

/** The classical variables decision rule (lib/sampling classicalDecision) as printed. */
export interface ClassicalDecisionFigures {
  direction: TestDirection;
  riskOfIncorrectRejection: number;
  riskOfIncorrectAcceptance: number;
  distribution: ClassicalDistribution;
  /** Student t only: n − 1, regression n − 2, stratified Satterthwaite's. */
  degreesOfFreedom: number | null;
  /** The sides of z_α used at planning and therefore at evaluation. */
  coefficientSides: "two" | "one";
  /** z_α (or t_α). */
  coefficient: number;
  /** A, planned. */
  plannedAllowance: Money;
  /** A′ = z_α · SE. */
  achievedAllowance: Money;
  /** A″ = A′ + TM · (1 − A′/A), when A′ > A; otherwise null. */
  adjustedAllowance: Money | null;
  /** The allowance the interval uses (A′ or A″). */
  allowance: Money;
  /** Ŷ − allowance; null when understatement is not tested. */
  lowerLimit: Money | null;
  /** Ŷ + allowance; null when overstatement is not tested. */
  upperLimit: Money | null;
  /** How far BV lies beyond the nearest limit tested ("0.00" when within). */
  beyondLimit: Money;
  beyond: "upper" | "lower" | null;
  supported: boolean;
  /** The rule in words, with the figures substituted. */
  rule: string;
}

export interface VariablesResultFigures {
  estimatedAuditedValue: Money;
  projectedMisstatement: Money;
  standardError: Money;
  misstatementsInSample: number;
  decision: ClassicalDecisionFigures;
}

/**
 * Items a classical evaluation takes at their actual misstatement, outside the estimator: key items
 * (examined 100 %) and accepted anomalous misstatements (ISA 530 ¶13, AU-C 530.13). The estimator
 * runs on the remainder; the estimate, the projection and both limits add these amounts.
 */
export interface AtActualFigures {
  remainderSize: number;
  remainderBookValue: Money;
  remainderEstimatedAuditedValue: Money;
  remainderProjectedMisstatement: Money;
  keyItems: { count: number; bookValue: Money; auditedValue: Money; misstatement: Money };
  anomalies: { count: number; misstatement: Money };
}

export interface VariablesEvaluationBlock extends VariablesResultFigures {
  method: "variables";
  estimator: Estimator;
  confidence: number;
  sides: Sides;
  tolerableMisstatement: Money;
  populationSize: number;
  populationBookValue: Money;
  sampleSize: number;
  sampleBookValue: Money;
  sampleAuditedValue: Money;
  /** Key items and accepted anomalies at actual; null when there are none. X and N above are the whole population's. */
  atActual: AtActualFigures | null;
  warnings: string[];
  formulaReferences: string[];
}

export interface StratumEvaluationRow {
  number: number;
  label: string;
  populationSize: number;
  populationBookValue: Money;
  sampleSize: number;
  sampleBookValue: Money;
  sampleAuditedValue: Money;
  misstatementsInSample: number;
  estimatedAuditedValue: Money;
  standardError: Money;
}

export interface StratifiedEvaluationBlock extends VariablesResultFigures {
  method: "stratified";
  estimator: StratifiedEstimator;
  confidence: number;
  sides: Sides;
  tolerableMisstatement: Money;
  populationSize: number;
  populationBookValue: Money;
  /** The strata cover the items outside the key items. */
  strata: StratumEvaluationRow[];
  atActual: AtActualFigures | null;
  warnings: string[];
  formulaReferences: string[];
}

export interface AttributesEvaluationBlock {
  method: "attributes";
  confidence: number;
  tolerableRate: number;
  expectedRate: number;
  sampleSize: number;
  allowedDeviations: number;
  deviations: number;
  sampleRate: number;
  upperDeviationLimit: number;
  /** "exact" Clopper–Pearson limit, or "table" (rounded up to 0.1 point as the published tables). */
  limitMode: "exact" | "table";
  /** The limit's distribution: binomial, or hypergeometric for a plan sized on its population's N. */
  model: "binomial" | "hypergeometric";
  /** Hypergeometric only: N and M_U, the largest number of deviations in the population the sample leaves plausible. */
  populationSize: number | null;
  upperDeviations: number | null;
  /** Plans sized from the firm's control-frequency table: the row used. No deviation is expected; the limit is for information. */
  controlFrequency: { frequency: string; minimumSampleSize: number } | null;
  /** UDL − k/n. */
  allowanceForSamplingRisk: number;
  /** A planned two-stage plan decides by its own rule (the deviation limit above is shown for information). */
  twoStage: {
    firstStageSize: number;
    secondStageSize: number;
    riskOfOverreliance: number;
    firstStageDeviations: number;
    secondStageDeviations: number | null;
    stage: 1 | 2;
    decision: "accept" | "reject" | "continue";
  } | null;
  supported: boolean;
  statement: string;
  warnings: string[];
  formulaReferences: string[];
}

/**
 * Nonstatistical evaluation (PCAOB AS 2315.26; AICPA Audit Guide "Audit Sampling", nonstatistical
 * evaluation): the sample's misstatement projected to the remainder, plus key items and accepted
 * anomalies at actual, compared with TM and with the firm's "well below" amount. No bound is claimed.
 */
export interface NonstatisticalEvaluationBlock {
  method: "nonstatistical";
  projection: "ratio" | "difference";
  direction: TestDirection;
  /** Items outside the key items with a result, their book value, and the misstatement found in them (anomalies included). */
  sampleCount: number;
  sampleBookValue: Money;
  sampleMisstatement: Money;
  remainderCount: number;
  remainderBookValue: Money;
  /** The sample's misstatement (accepted anomalies excluded) projected to the remainder. */
  projectedMisstatement: Money;
  keyItems: { planned: number; evaluated: number; misstatement: Money };
  anomalies: { count: number; misstatement: Money };
  /** Projection + key items + anomalies (overstatement positive). */
  totalProjected: Money;
  /** The total in the direction tested, as compared with TM. */
  comparedAmount: Money;
  tolerableMisstatement: Money;
  expectedMisstatement: Money;
  wellBelowAmount: Money;
  /** What "well below" means under the firm's setting stamped on the plan, in words with the amount. */
  wellBelowBasis: string;
  /** "approaches": below TM but not well below it; the Guide treats it, like "exceeds", as an unacceptably high risk. */
  verdict: "supports" | "approaches" | "exceeds";
  supported: boolean;
  statement: string;
  /** The usual responses when the sample does not support the amount; empty otherwise. */
  responses: string[];
  warnings: string[];
  formulaReferences: string[];
}

export type EvaluationBlock =
  | NonstatisticalEvaluationBlock
  | MusEvaluationBlock
  | VariablesEvaluationBlock
  | StratifiedEvaluationBlock
  | AttributesEvaluationBlock;

/** Where the computed result stands. */
export type ComputedStatus = "no-results" | "provisional" | "supported" | "not-supported" | "not-evaluable";

/** The result as computed by Sondage, kept apart from the auditor's own conclusion. */
export interface ComputedResult {
  status: ComputedStatus;
  /** null until every item has a result. */
  supported: boolean | null;
  /** One sentence: provisional wording until every item has a result. */
  statement: string;
  /** The decision rule in words, so a reviewer can re-perform it. */
  rule: string;
  /** The computed result calls for a recorded response: not supported, or the limit close to tolerable. */
  responseNeeded: boolean;
}
