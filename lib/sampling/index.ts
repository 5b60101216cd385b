/**
 * Sondage sampling engine — public surface (contract: lib/sampling/README.md). Pure TypeScript, no I/O.
 */
export { createRng, type Rng } from "./rng";
export { selectRandom } from "./select-random";
export { selectSystematic } from "./select-systematic";
export { selectPps, type PpsHit, type PpsSelection } from "./select-pps";
export { selectStratifiedRandom } from "./select-stratified";
export { attributeSampleSize, type AttributeSampleSize } from "./sizes/attribute-sample-size";
export { hypergeometricCdf } from "./hypergeometric";
export { bookSignRisk, type BookSignRisk } from "./book-sign-risk";
export { planningSpread, type PlanningSpread } from "./planning-spread";
export {
  musSampleSize,
  EXPANSION_FACTORS,
  MUS_SIZE_METHODS,
  type MusSizeMethod,
  type MusSampleSize,
} from "./sizes/mus-sample-size";
export { musConfidenceFactor } from "./sizes/mus-confidence-factor";
export { variablesSampleSize } from "./sizes/variables-sample-size";
export { neymanAllocation, stratifiedSampleSize, type PlanningStratum } from "./sizes/stratified-sample-size";
export { evaluateVariables } from "./evaluate-variables";
export { evaluateStratified, type StratumInput } from "./evaluate-stratified";
export { poissonFactor } from "./poisson-factor";
export {
  evaluateMus,
  MUS_MIN_CONFIDENCE,
  MUS_CONFIDENCE_MESSAGE,
  type BoundSide,
  type MusEvaluation,
} from "./evaluate-mus";
export { evaluateAttributes, type AttributeEvaluation } from "./evaluate-attributes";
export { EngineInputError } from "./errors";
export type { SampledItem, Estimator, StratifiedEstimator, Sides, FactorMode, VariablesEvaluation } from "./types";
export {
  simulateEstimators,
  SIMULATED_ESTIMATORS,
  type EstimatorPerformance,
  type HistogramBin,
  type SimulatedEstimator,
} from "./simulate";
export { correctedRatioEstimates, CORRECTED_RATIO_ESTIMATORS, type CorrectedRatioEstimator } from "./ratio-corrected";
export { simulateStringer, type StringerPerformance } from "./simulate-stringer";
export {
  assumeAuditedValues,
  observedTaintings,
  TAINTING_PATTERNS,
  type MisstatementScenario,
  type TaintingPattern,
} from "./scenario";
export {
  recommendEstimator,
  ADVISED_ESTIMATOR_LABELS,
  FEW_DIFFERENCES,
  type AdvisedEstimator,
  type AdvisorCell,
  type Recommendation,
  type Verdict,
  isComparisonEstimator,
} from "./advise";
export { classicalDecision, type ClassicalDecision } from "./classical-decision";
export {
  twoStageAttributePlan,
  evaluateTwoStageAttributes,
  twoStageRisk,
  type TwoStageAttributePlan,
  type TwoStageEvaluation,
} from "./two-stage-attributes";
export { satterthwaite, SMALL_STRATUM } from "./evaluate-stratified";
export { SMALL_SAMPLE } from "./evaluate-variables";
export { studentQuantile } from "./quantiles";
export type { TestDirection, ClassicalDistribution } from "./types";
export {
  nonstatisticalSampleSize,
  EXPECTED_MISSTATEMENT_ADJUSTMENTS,
  type ExpectedMisstatementAdjustment,
  type NonstatisticalSize,
} from "./sizes/nonstatistical-sample-size";
export {
  projectMisstatement,
  PROJECTION_METHODS,
  type ProjectionMethod,
  type ProjectedMisstatement,
} from "./project-misstatement";
