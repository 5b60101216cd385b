/**
 * Stratified classical variables evaluation: variances add across independent strata.
 */
import { pairedMoments, type PairedMoments } from "./descriptive";
import {
  boundsFrom,
  distributionOption,
  fewMisstatementsWarning,
  MIN_MISSTATEMENTS,
  SMALL_SAMPLE,
  smallSampleWarning,
  zFor,
} from "./evaluate-variables";
import { toCents } from "./money";
import { sampleToCents } from "./sample-input";
import {
  SIDES,
  STRATIFIED_ESTIMATORS,
  type ClassicalDistribution,
  type SampledItem,
  type Sides,
  type StratifiedEstimator,
  type VariablesEvaluation,
} from "./types";
import { estimateTotal } from "./variables-core";
import { requireArray, requireInteger, requireObject, requireOneOf, requireOpenFraction } from "./validate";
import { EngineInputError } from "./errors";

/** Common practice: a stratum with fewer sampled items than this gets a warning. */
export const SMALL_STRATUM = 10;

/** Satterthwaite's effective degrees of freedom of a sum of independent variance estimates. */
export function satterthwaite(parts: { variance: number; n: number }[]): number {
  const total = parts.reduce((sum, p) => sum + p.variance, 0);
  const denominator = parts.reduce((sum, p) => sum + (p.variance * p.variance) / (p.n - 1), 0);
  if (!(denominator > 0)) return parts.reduce((sum, p) => sum + p.n - 1, 0);
  return (total * total) / denominator;
}

export interface StratumInput {
  populationSize: number;
  populationBookValue: number;
  sample: SampledItem[];
}

interface ParsedStratum {
  N: number;
  bookCents: number;
  m: PairedMoments;
}

function parseStrata(value: unknown): ParsedStratum[] {
  const strata = requireArray<StratumInput>("strata", value);
  if (strata.length === 0) throw new EngineInputError("strata", "strata must contain at least one stratum");
  return strata.map((s, h) => {
    requireObject(`strata[${h}]`, s);
    const N = requireInteger(`strata[${h}].populationSize`, s.populationSize, 2, 2 ** 31 - 1);
    const bookCents = toCents(`strata[${h}].populationBookValue`, s.populationBookValue);
    const { book, audited } = sampleToCents(`strata[${h}].sample`, s.sample, 2, N);
    return { N, bookCents, m: pairedMoments(book, audited) };
  });
}

/** Combined ratio (Cochran 1977 §6.11): R_c = Ŷ_st / X̂_st, e = y − R_c x within each stratum. */
function combinedRatio(
  strata: ParsedStratum[],
  totalBook: number,
): { estimate: number; variance: number; perStratum: { estimate: number; variance: number }[] } {
  let yst = 0;
  let xst = 0;
  for (const { N, m } of strata) {
    yst += N * m.meanY;
    xst += N * m.meanX;
  }
  if (xst === 0)
    throw new EngineInputError(
      "strata",
      "strata sample bookValue totals must not be zero for the combined ratio estimator",
    );
  const rc = yst / xst;
  const q = 1 - rc;
  const perStratum = strata.map(({ N, m, bookCents }) => {
    const varE = Math.max(0, m.varD + q * q * m.varX + 2 * q * m.covXD);
    return { estimate: rc * bookCents, variance: ((N * N * (1 - m.n / N)) / m.n) * varE };
  });
  const variance = perStratum.reduce((sum, s) => sum + s.variance, 0);
  return { estimate: rc * totalBook, variance, perStratum };
}

/**
 * Stratified variables evaluation (Cochran, Sampling Techniques, 3rd ed., 1977, ch. 5 and §§6.10–6.11).
 *
 * - mean-per-unit: Y = Σ N_h ȳ_h; v = Σ N_h² (1 − f_h) s²_yh / n_h
 * - difference: Y = Σ (X_h + N_h d̄_h); v = Σ N_h² (1 − f_h) s²_dh / n_h
 * - separate-ratio: Y = Σ (ȳ_h / x̄_h) X_h; v = Σ of each stratum's ratio variance ("N form")
 * - combined-ratio: R_c = Σ N_h ȳ_h / Σ N_h x̄_h; Y = R_c X;
 *   v = Σ N_h² (1 − f_h) / n_h · s²(y − R_c x)_h
 * Bounds and z as in `evaluateVariables`. Every stratum needs n_h >= 2. With distribution "t" the
 * coefficient is Student's t with Satterthwaite's effective degrees of freedom
 * ν = (Σ v_h)² / Σ (v_h² / (n_h − 1)), v_h the stratum's variance contribution (Satterthwaite,
 * Biometrics Bulletin 2, 1946; Cochran 1977 §5.4, from memory for the section). Warns when n < 30
 * or any stratum has n_h < 10, naming the stratum.
 *
 * @throws {TypeError} when a field has the wrong type.
 * @throws {RangeError} naming `strata[h].field` for an invalid stratum, or the option at fault.
 * @example
 * evaluateStratified({ estimator: "mean-per-unit", strata, confidence: 0.95, sides: "two" })
 * // → { estimatedAuditedValue: 1126583.33…, standardError: 70072.198…, … }  (the two-stratum test data)
 */
export function evaluateStratified(o: {
  estimator: StratifiedEstimator;
  strata: StratumInput[];
  confidence: number;
  sides: Sides;
  distribution?: ClassicalDistribution;
}): VariablesEvaluation & { strata: { estimatedAuditedValue: number; standardError: number }[] } {
  requireObject("options", o);
  const estimator = requireOneOf("estimator", o.estimator, STRATIFIED_ESTIMATORS);
  const strata = parseStrata(o.strata);
  const confidence = requireOpenFraction("confidence", o.confidence);
  const sides = requireOneOf("sides", o.sides, SIDES);
  const distribution = distributionOption(o.distribution);
  const totalBook = strata.reduce((sum, s) => sum + s.bookCents, 0);
  if (!Number.isSafeInteger(totalBook))
    throw new EngineInputError("strata", "strata populationBookValue total exceeds the exact range in cents");

  let pooled: { estimate: number; variance: number; perStratum: { estimate: number; variance: number }[] };
  if (estimator === "combined-ratio") {
    pooled = combinedRatio(strata, totalBook);
  } else {
    const core = estimator === "separate-ratio" ? "ratio" : estimator;
    const perStratum = strata.map((s, h) => {
      if (core === "ratio" && s.m.sumX === 0)
        throw new EngineInputError(
          `strata[${h}].sample`,
          `strata[${h}].sample bookValue total must not be zero for the ratio estimator`,
        );
      return estimateTotal(core, s.m, s.N, s.bookCents);
    });
    const estimate = perStratum.reduce((sum, s) => sum + s.estimate, 0);
    const variance = perStratum.reduce((sum, s) => sum + s.variance, 0);
    pooled = { estimate, variance, perStratum };
  }

  const degreesOfFreedom = satterthwaite(
    pooled.perStratum.map((s, h) => ({ variance: s.variance, n: strata[h]!.m.n })),
  );
  const z = zFor(confidence, sides, distribution === "t" ? degreesOfFreedom : null);
  const result = boundsFrom(pooled.estimate, pooled.variance, totalBook, z, sides);
  const misstatements = strata.reduce((sum, s) => sum + s.m.nonZeroDifferences, 0);
  const warnings: string[] = [];
  const n = strata.reduce((sum, s) => sum + s.m.n, 0);
  if (n < SMALL_SAMPLE) warnings.push(smallSampleWarning(n, distribution));
  strata.forEach((s, h) => {
    if (s.m.n < SMALL_STRATUM)
      warnings.push(
        `Stratum ${h + 1} has only ${s.m.n} sampled items: below ${SMALL_STRATUM} per stratum the normal approximation is weak (common practice).`,
      );
  });
  if (estimator !== "mean-per-unit" && misstatements < MIN_MISSTATEMENTS)
    warnings.push(fewMisstatementsWarning(estimator, misstatements));
  const smallStrata = strata.flatMap((s, h) => (s.m.n < MIN_MISSTATEMENTS ? [h + 1] : []));
  if (estimator === "separate-ratio" && smallStrata.length > 0) {
    warnings.push(
      `The separate ratio estimator's bias adds up across strata and stratum ${smallStrata.join(", ")} ha${smallStrata.length === 1 ? "s" : "ve"} fewer than ${MIN_MISSTATEMENTS} sampled items: consider the combined ratio estimator (Cochran 1977 §6.11).`,
    );
  }
  return {
    ...result,
    misstatementsInSample: misstatements,
    warnings,
    zValue: z,
    distribution,
    degreesOfFreedom,
    strata: pooled.perStratum.map((s) => ({
      estimatedAuditedValue: s.estimate / 100,
      standardError: Math.sqrt(s.variance) / 100,
    })),
  };
}
