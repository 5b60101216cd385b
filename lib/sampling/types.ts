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
  /** The normal quantile used for the allowance. */
  zValue: number;
}
