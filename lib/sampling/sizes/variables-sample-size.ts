/**
 * Classical variables (mean-per-unit) sample size.
 */
import { normalQuantile } from "../quantiles";
import { requireFiniteNumber, requireInteger, requireObject, requireOpenFraction, requirePositive } from "../validate";
import { EngineInputError } from "../errors";

/**
 * Mean-per-unit sample size with planned allowance for sampling risk (AICPA Audit Guide
 * "Audit Sampling", classical variables; the presentation is from memory, the algebra exact).
 *
 * z_a = normal quantile for the risk of incorrect rejection: two-sided (z at 1 − RIR/2) when both
 *   directions are tested (`sides` "two", the default), one-sided (z at 1 − RIR) for one direction,
 * z_b = one-sided quantile for the risk of incorrect acceptance (z at 1 − RIA);
 * A = (TM − EM) · z_a / (z_a + z_b); n' = (N · z_a · SD / A)²; n = ceil(n' / (1 + n'/N)).
 *
 * @returns sampleSize n, uncorrectedSampleSize ceil(n'), uncorrectedSampleSizeExact n' (unrounded)
 *   and plannedAllowance A.
 * @throws {TypeError} when a field is not a number.
 * @throws {RangeError} naming the field when out of range, or when TM <= EM.
 * @example
 * variablesSampleSize({ populationSize: 2000, estimatedStdDev: 120, tolerableMisstatement: 40000,
 *   riskOfIncorrectAcceptance: 0.05, riskOfIncorrectRejection: 0.1 })
 * // → { sampleSize: 327, uncorrectedSampleSize: 390, uncorrectedSampleSizeExact: 389.598…,
 * //     plannedAllowance: 20000 }
 */
export function variablesSampleSize(o: {
  populationSize: number;
  estimatedStdDev: number;
  tolerableMisstatement: number;
  expectedMisstatement?: number;
  riskOfIncorrectAcceptance: number;
  riskOfIncorrectRejection: number;
  sides?: "two" | "one";
}): {
  sampleSize: number;
  uncorrectedSampleSize: number;
  uncorrectedSampleSizeExact: number;
  plannedAllowance: number;
} {
  requireObject("options", o);
  const populationSize = requireInteger("populationSize", o.populationSize, 1, 2 ** 31 - 1);
  const sd = requirePositive("estimatedStdDev", o.estimatedStdDev);
  const tolerable = requirePositive("tolerableMisstatement", o.tolerableMisstatement);
  const expected =
    o.expectedMisstatement === undefined ? 0 : requireFiniteNumber("expectedMisstatement", o.expectedMisstatement);
  if (expected < 0 || expected >= tolerable) {
    throw new EngineInputError(
      "expectedMisstatement",
      `expectedMisstatement must be at least 0 and below tolerableMisstatement (${tolerable}) (got ${expected})`,
    );
  }
  const ria = requireOpenFraction("riskOfIncorrectAcceptance", o.riskOfIncorrectAcceptance);
  const rir = requireOpenFraction("riskOfIncorrectRejection", o.riskOfIncorrectRejection);
  if (o.sides !== undefined && o.sides !== "two" && o.sides !== "one")
    throw new RangeError(`sides must be "two" or "one" (got ${String(o.sides)})`);
  const zA = normalQuantile(o.sides === "one" ? 1 - rir : 1 - rir / 2);
  const zB = normalQuantile(1 - ria);
  const plannedAllowance = ((tolerable - expected) * zA) / (zA + zB);
  const uncorrected = ((populationSize * zA * sd) / plannedAllowance) ** 2;
  const corrected = uncorrected / (1 + uncorrected / populationSize);
  return {
    sampleSize: Math.min(populationSize, Math.ceil(corrected - 1e-9)),
    uncorrectedSampleSize: Math.ceil(uncorrected - 1e-9),
    uncorrectedSampleSizeExact: uncorrected,
    plannedAllowance,
  };
}
