/**
 * The standard deviation a classical plan should be sized with: the spread that drives the chosen
 * estimator's variance, measured on an earlier sample's results.
 */
import { toCents } from "./money";
import { ESTIMATORS, type Estimator, type SampledItem } from "./types";
import { requireArray, requireObject, requireOneOf } from "./validate";
import { EngineInputError } from "./errors";

export interface PlanningSpread {
  standardDeviation: number;
  /** s_y (audited values), s_d (differences) or s_e (ratio or regression residuals). */
  symbol: "s_y" | "s_d" | "s_e";
  items: number;
}

/**
 * Planning standard deviation per estimator (Cochran 1977, Sampling Techniques, 3rd ed.):
 * mean-per-unit s_y² = Σ(y − ȳ)²/(n − 1) (§2.10); difference s_d² = Σ(d − d̄)²/(n − 1), d = y − x
 * (§7.2 with b = 1); ratio s_e² = Σ(y − R̂x)²/(n − 1), R̂ = Σy/Σx (eq. 6.9); regression
 * s_e² = Σ(y − ȳ − b(x − x̄))²/(n − 2), b the least-squares slope (§7.3). The variance of each
 * estimator's total is N²(1 − f)s²/n, so n′ = (N·z·s/A)² sizes it as mean-per-unit sizing does.
 *
 * @throws {TypeError|RangeError} naming the field: fewer than 2 items (3 for regression), an unknown
 *   estimator, a ratio sample whose book total is zero, a regression sample with no spread in book values.
 * @example
 * planningSpread({ estimator: "difference", sample: [{ bookValue: 100, auditedValue: 90 }, { bookValue: 50, auditedValue: 50 }, { bookValue: 80, auditedValue: 74 }] })
 * // → { standardDeviation: 5.033222956847166, symbol: "s_d", items: 3 }
 */
export function planningSpread(o: { estimator: Estimator; sample: SampledItem[] }): PlanningSpread {
  requireObject("options", o);
  const estimator = requireOneOf("estimator", o.estimator, ESTIMATORS);
  const sample = requireArray<SampledItem>("sample", o.sample);
  const n = sample.length;
  const min = estimator === "regression" ? 3 : 2;
  if (n < min)
    throw new EngineInputError(
      "sample",
      `sample must hold at least ${min} items with results for the ${estimator} estimator's spread (got ${n})`,
    );
  const x = sample.map((s, i) => toCents(`sample[${i}].bookValue`, s.bookValue) / 100);
  const y = sample.map((s, i) => toCents(`sample[${i}].auditedValue`, s.auditedValue) / 100);
  const mean = (v: number[]) => v.reduce((a, b) => a + b, 0) / v.length;
  const sumSq = (v: number[]) => {
    const m = mean(v);
    return v.reduce((a, b) => a + (b - m) ** 2, 0);
  };
  if (estimator === "mean-per-unit")
    return { standardDeviation: Math.sqrt(sumSq(y) / (n - 1)), symbol: "s_y", items: n };
  if (estimator === "difference")
    return { standardDeviation: Math.sqrt(sumSq(y.map((v, i) => v - x[i]!)) / (n - 1)), symbol: "s_d", items: n };
  if (estimator === "ratio") {
    const bookTotal = x.reduce((a, b) => a + b, 0);
    if (bookTotal === 0)
      throw new EngineInputError("sample", "sample book total is zero: the ratio estimator is not defined for it");
    const r = y.reduce((a, b) => a + b, 0) / bookTotal;
    return {
      standardDeviation: Math.sqrt(y.reduce((a, v, i) => a + (v - r * x[i]!) ** 2, 0) / (n - 1)),
      symbol: "s_e",
      items: n,
    };
  }
  const xBar = mean(x),
    yBar = mean(y);
  const sxx = sumSq(x);
  if (sxx === 0)
    throw new EngineInputError("sample", "sample book values have no spread: the regression slope is not defined");
  const b = x.reduce((a, v, i) => a + (v - xBar) * (y[i]! - yBar), 0) / sxx;
  const residuals = y.reduce((a, v, i) => a + (v - yBar - b * (x[i]! - xBar)) ** 2, 0);
  return { standardDeviation: Math.sqrt(residuals / (n - 2)), symbol: "s_e", items: n };
}
