/**
 * The decision rule of a classical variables sample: does the recorded book value lie within the
 * interval the sample supports, on the side(s) the test was designed for?
 */
import { normalQuantile, studentQuantile } from "./quantiles";
import { CLASSICAL_DISTRIBUTIONS, TEST_DIRECTIONS, type ClassicalDistribution, type TestDirection } from "./types";
import { requireFiniteNumber, requireObject, requireOneOf, requireOpenFraction, requirePositive } from "./validate";

export interface ClassicalDecision {
  /** The reliability coefficient for the risk of incorrect rejection (z_α, or t_α with `degreesOfFreedom`). */
  coefficient: number;
  distribution: ClassicalDistribution;
  degreesOfFreedom: number | null;
  /** "two" for a test of both directions (coefficient at 1 − α/2), "one" otherwise (at 1 − α). */
  coefficientSides: "two" | "one";
  /** A′ = coefficient · SE. */
  achievedAllowance: number;
  /** A″ = A′ + TM · (1 − A′/A) when A′ > A; null otherwise. */
  adjustedAllowance: number | null;
  /** The allowance the interval uses: A′, or A″ when A′ > A. */
  allowance: number;
  /** Ŷ − allowance (−Infinity when understatement is not tested: the side is open). */
  lowerLimit: number;
  /** Ŷ + allowance (Infinity when overstatement is not tested). */
  upperLimit: number;
  /** BV within the interval on the side(s) tested. */
  supported: boolean;
  /** How far BV lies beyond the nearest limit tested (0 when within): the adjustment to consider. */
  beyondLimit: number;
  /** Which limit BV lies beyond: "upper" (BV overstated), "lower" (BV understated), or null. */
  beyond: "upper" | "lower" | null;
}

function coefficientFor(
  alpha: number,
  sides: "two" | "one",
  distribution: ClassicalDistribution,
  df: number | null,
): number {
  const p = sides === "two" ? 1 - alpha / 2 : 1 - alpha;
  return distribution === "t" ? studentQuantile(p, df!) : normalQuantile(p);
}

/**
 * Classical variables decision rule (AICPA Audit Guide "Audit Sampling", classical variables
 * evaluation; presentation from memory, algebra exact):
 * achieved allowance A′ = z_α · SE with z_α the coefficient for the planned risk of incorrect
 * rejection α — two-sided (1 − α/2) when both directions are tested, one-sided (1 − α) otherwise,
 * the same sides the plan was sized with (`plannedSides` overrides the default for plans sized
 * otherwise, so that evaluation never uses other sides than planning did). When A′ ≤ A (the planned allowance) the interval is
 * Ŷ ± A′; when A′ > A it is Ŷ ± A″ with the adjusted allowance A″ = A′ + TM · (1 − A′/A), which
 * keeps the risk of incorrect acceptance at the planned β (with EM = 0 it is the same as requiring
 * projected misstatement + z_β · SE ≤ TM). The book value is supported when it lies within the
 * interval on the side(s) tested: overstatement BV ≤ Ŷ + allowance, understatement BV ≥ Ŷ − allowance.
 * With distribution "t" the coefficient is Student's t with `degreesOfFreedom`.
 *
 * @throws {TypeError} when a field is not a number.
 * @throws {RangeError} naming the field: standardError < 0, tolerableMisstatement or plannedAllowance
 *   <= 0, riskOfIncorrectRejection outside (0, 1), unknown direction or distribution, "t" without
 *   degreesOfFreedom > 0.
 * @example
 * classicalDecision({ bookValue: 4006960.42, estimatedAuditedValue: 3971052.82, standardError: 35607.11,
 *   tolerableMisstatement: 100000, plannedAllowance: 50000, riskOfIncorrectRejection: 0.1, direction: "both" })
 * // → { achievedAllowance: 58568.49…, adjustedAllowance: 41431.50…, supported: true, beyondLimit: 0, … }
 */
export function classicalDecision(o: {
  bookValue: number;
  estimatedAuditedValue: number;
  standardError: number;
  tolerableMisstatement: number;
  plannedAllowance: number;
  riskOfIncorrectRejection: number;
  direction: TestDirection;
  /** The z_α sides the plan was sized with (default: "two" for both directions, "one" otherwise). */
  plannedSides?: "two" | "one";
  distribution?: ClassicalDistribution;
  degreesOfFreedom?: number;
}): ClassicalDecision {
  requireObject("options", o);
  const bookValue = requireFiniteNumber("bookValue", o.bookValue);
  const estimate = requireFiniteNumber("estimatedAuditedValue", o.estimatedAuditedValue);
  const se = requirePositive("standardError", o.standardError, true);
  const tm = requirePositive("tolerableMisstatement", o.tolerableMisstatement);
  const planned = requirePositive("plannedAllowance", o.plannedAllowance);
  const alpha = requireOpenFraction("riskOfIncorrectRejection", o.riskOfIncorrectRejection);
  const direction = requireOneOf("direction", o.direction, TEST_DIRECTIONS);
  const distribution =
    o.distribution === undefined ? "z" : requireOneOf("distribution", o.distribution, CLASSICAL_DISTRIBUTIONS);
  const df = distribution === "t" ? requirePositive("degreesOfFreedom", o.degreesOfFreedom) : null;
  const coefficientSides =
    o.plannedSides === undefined
      ? direction === "both"
        ? "two"
        : "one"
      : requireOneOf("plannedSides", o.plannedSides, ["two", "one"] as const);
  const coefficient = coefficientFor(alpha, coefficientSides, distribution, df);
  const achieved = coefficient * se;
  const adjusted = achieved > planned ? achieved + tm * (1 - achieved / planned) : null;
  const allowance = adjusted ?? achieved;
  const lowerLimit = direction === "overstatement" ? -Infinity : estimate - allowance;
  const upperLimit = direction === "understatement" ? Infinity : estimate + allowance;
  const overBy = bookValue - upperLimit;
  const underBy = lowerLimit - bookValue;
  const beyond = overBy > 0 ? "upper" : underBy > 0 ? "lower" : null;
  return {
    coefficient,
    distribution,
    degreesOfFreedom: df,
    coefficientSides,
    achievedAllowance: achieved,
    adjustedAllowance: adjusted,
    allowance,
    lowerLimit,
    upperLimit,
    supported: beyond === null,
    beyondLimit: beyond === "upper" ? overBy : beyond === "lower" ? underBy : 0,
    beyond,
  };
}
