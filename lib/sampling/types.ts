/** Shared shapes of the engine's public surface (lib/sampling/README.md). */

/** One sampled item: book value and audited value in currency units (misstatement = book − audited). */
export interface SampledItem {
  bookValue: number;
  auditedValue: number;
}

export type Estimator = "mean-per-unit" | "difference" | "ratio" | "regression";
export const ESTIMATORS: readonly Estimator[] = ["mean-per-unit", "difference", "ratio", "regression"];

export type StratifiedEstimator = "mean-per-unit" | "difference" | "separate-ratio" | "combined-ratio";
export const STRATIFIED_ESTIMATORS: readonly StratifiedEstimator[] = [
  "mean-per-unit",
  "difference",
  "separate-ratio",
  "combined-ratio",
];

export type Sides = "two" | "upper" | "lower";
export const SIDES: readonly Sides[] = ["two", "upper", "lower"];

/** "exact": Poisson factors from the gamma quantile; "table": the same rounded up to 2 decimals. */
export type FactorMode = "exact" | "table";
export const FACTOR_MODES: readonly FactorMode[] = ["exact", "table"];

/** Shape of a variables evaluation, plain or stratified. */
export interface VariablesEvaluation {
  estimatedAuditedValue: number;
  projectedMisstatement: number;
  standardError: number;
  allowance: number;
  lowerBound: number;
  upperBound: number;
  misstatementsInSample: number;
  warnings: string[];
  /** The reliability coefficient used for the allowance: the normal quantile, or Student's t. */
  zValue: number;
  distribution: "z" | "t";
  /** n − 1 (regression n − 2; stratified: Satterthwaite's effective degrees of freedom). */
  degreesOfFreedom: number;
}

/** The direction(s) of misstatement a substantive test is designed to detect. */
export type TestDirection = "overstatement" | "understatement" | "both";
export const TEST_DIRECTIONS: readonly TestDirection[] = ["overstatement", "understatement", "both"];

/** Reliability coefficient of classical variables bounds: normal "z" (default) or Student "t". */
export type ClassicalDistribution = "z" | "t";
export const CLASSICAL_DISTRIBUTIONS: readonly ClassicalDistribution[] = ["z", "t"];
