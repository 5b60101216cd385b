/**
 * Stratified mean-per-unit planning: Neyman allocation and the total sample size for a planned
 * allowance (Cochran, Sampling Techniques, 3rd ed., 1977, ch. 5 — equation numbers from memory;
 * the formulas are re-derived).
 */
import { normalQuantile } from "../quantiles";
import { requireArray, requireInteger, requireObject, requireOpenFraction, requirePositive } from "../validate";
import { EngineInputError } from "../errors";

export interface PlanningStratum {
  populationSize: number;
  /** Estimated standard deviation of audited values in the stratum (currency units). */
  standardDeviation: number;
}

interface Parsed {
  N: number;
  S: number;
}

function parse(value: unknown): Parsed[] {
  const strata = requireArray<PlanningStratum>("strata", value);
  if (strata.length === 0) throw new EngineInputError("strata", "strata must contain at least one stratum");
  return strata.map((s, h) => {
    requireObject(`strata[${h}]`, s);
    return {
      N: requireInteger(`strata[${h}].populationSize`, s.populationSize, 1, 2 ** 31 - 1),
      S: requirePositive(`strata[${h}].standardDeviation`, s.standardDeviation, true),
    };
  });
}

/** Real-valued Neyman allocation n_h ∝ N_h S_h, with strata that would exceed N_h taken 100%. */
function exactAllocation(strata: Parsed[], n: number): number[] {
  const out = new Array<number>(strata.length).fill(0);
  const full = new Set<number>();
  for (;;) {
    const free = strata.map((_, h) => h).filter((h) => !full.has(h));
    const remaining = n - [...full].reduce((sum, h) => sum + strata[h]!.N, 0);
    const weight = free.reduce((sum, h) => sum + strata[h]!.N * strata[h]!.S, 0);
    const sizeOfFree = free.reduce((sum, h) => sum + strata[h]!.N, 0);
    let capped = false;
    for (const h of free) {
      const w = weight > 0 ? (strata[h]!.N * strata[h]!.S) / weight : strata[h]!.N / sizeOfFree;
      out[h] = remaining * w;
      if (out[h] > strata[h]!.N) capped = true;
    }
    if (!capped) return out;
    for (const h of free)
      if (out[h]! > strata[h]!.N) {
        full.add(h);
        out[h] = strata[h]!.N;
      }
  }
}

/** Largest-remainder rounding (ties to the earlier stratum), then at least min(2, N_h) per stratum. */
function roundAllocation(strata: Parsed[], exact: number[], n: number): number[] {
  const alloc = exact.map((x) => Math.floor(x + 1e-9));
  let left = n - alloc.reduce((a, b) => a + b, 0);
  const order = exact.map((_, h) => h).sort((a, b) => exact[b]! - alloc[b]! - (exact[a]! - alloc[a]!) || a - b);
  for (const h of order)
    if (left > 0 && alloc[h]! < strata[h]!.N) {
      alloc[h]!++;
      left--;
    }
  for (let h = 0; h < strata.length; h++) {
    while (alloc[h]! < Math.min(2, strata[h]!.N)) {
      const donor = alloc
        .map((_, j) => j)
        .filter((j) => alloc[j]! > Math.min(2, strata[j]!.N))
        .sort((a, b) => alloc[b]! - exact[b]! - (alloc[a]! - exact[a]!) || alloc[b]! - alloc[a]!)[0];
      alloc[h]!++;
      if (donor !== undefined) alloc[donor]!--;
    }
  }
  return alloc;
}

function standardError(strata: Parsed[], sizes: number[]): number {
  let v = 0;
  strata.forEach(({ N, S }, h) => {
    if (sizes[h]! > 0) v += (N * N * (1 - sizes[h]! / N) * S * S) / sizes[h]!;
  });
  return Math.sqrt(v);
}

/**
 * Neyman (optimum) allocation of a total sample size: n_h = n · N_h S_h / Σ N_j S_j; a stratum whose
 * share exceeds N_h is taken 100% and the rest reallocated. Integers by largest remainder, keeping
 * Σ n_h = n and n_h >= min(2, N_h) so every stratum has a variance estimate.
 *
 * @returns allocation (integers), exactAllocation (before rounding), standardError of the stratified
 *   MPU total under the exact allocation ((Σ N_h S_h)²/n − Σ N_h S_h² when nothing is capped) and
 *   allocatedStandardError under the integers.
 * @throws {TypeError} when a field has the wrong type.
 * @throws {RangeError} naming the field; sampleSize must be between Σ min(2, N_h) and Σ N_h.
 * @example
 * neymanAllocation({ strata: [{ populationSize: 100, standardDeviation: 2000 },
 *   { populationSize: 400, standardDeviation: 400 }, { populationSize: 1500, standardDeviation: 80 }], sampleSize: 150 })
 * // → { allocation: [63, 50, 37], exactAllocation: [62.5, 50, 37.5], standardError: 32594.478…, … }
 */
export function neymanAllocation(o: { strata: PlanningStratum[]; sampleSize: number }): {
  allocation: number[];
  exactAllocation: number[];
  standardError: number;
  allocatedStandardError: number;
} {
  requireObject("options", o);
  const strata = parse(o.strata);
  const minimum = strata.reduce((sum, s) => sum + Math.min(2, s.N), 0);
  const total = strata.reduce((sum, s) => sum + s.N, 0);
  const n = requireInteger("sampleSize", o.sampleSize, minimum, total);
  const exact = exactAllocation(strata, n);
  const allocation = roundAllocation(strata, exact, n);
  return {
    allocation,
    exactAllocation: exact,
    standardError: standardError(strata, exact),
    allocatedStandardError: standardError(strata, allocation),
  };
}

/**
 * Total stratified MPU sample size for a planned allowance A at a confidence, under Neyman
 * allocation with finite population correction: V = (A / z)², n = (Σ N_h S_h)² / (V + Σ N_h S_h²),
 * z two-sided at (1 + c)/2 (or one-sided at c). n is rounded up, then raised while the integer
 * allocation's standard error still exceeds A / z (capped strata, rounding).
 *
 * @throws {TypeError} when a field has the wrong type.
 * @throws {RangeError} naming the field when out of range.
 * @example
 * stratifiedSampleSize({ strata: [{ populationSize: 100, standardDeviation: 2000 },
 *   { populationSize: 400, standardDeviation: 400 }, { populationSize: 1500, standardDeviation: 80 }],
 *   plannedAllowance: 60000, confidence: 0.95 })
 * // → { sampleSize: 164, exactSampleSize: 163.318…, allocation: [68, 55, 41], … }
 */
export function stratifiedSampleSize(o: {
  strata: PlanningStratum[];
  plannedAllowance: number;
  confidence: number;
  sides?: "two" | "one";
}): { sampleSize: number; exactSampleSize: number; allocation: number[]; allocatedStandardError: number } {
  requireObject("options", o);
  const strata = parse(o.strata);
  const allowance = requirePositive("plannedAllowance", o.plannedAllowance);
  const confidence = requireOpenFraction("confidence", o.confidence);
  if (o.sides !== undefined && o.sides !== "two" && o.sides !== "one")
    throw new EngineInputError("sides", `sides must be "two" or "one" (got ${String(o.sides)})`);
  const z = normalQuantile(o.sides === "one" ? confidence : (1 + confidence) / 2);
  const targetSe = allowance / z;
  const sumNS = strata.reduce((sum, s) => sum + s.N * s.S, 0);
  const sumNS2 = strata.reduce((sum, s) => sum + s.N * s.S * s.S, 0);
  const total = strata.reduce((sum, s) => sum + s.N, 0);
  const minimum = strata.reduce((sum, s) => sum + Math.min(2, s.N), 0);
  const exactSampleSize = (sumNS * sumNS) / (targetSe * targetSe + sumNS2);
  let n = Math.min(total, Math.max(minimum, Math.ceil(exactSampleSize - 1e-9)));
  let plan = neymanAllocation({ strata: o.strata, sampleSize: n });
  while (plan.allocatedStandardError > targetSe * (1 + 1e-12) && n < total) {
    n++;
    plan = neymanAllocation({ strata: o.strata, sampleSize: n });
  }
  return {
    sampleSize: n,
    exactSampleSize,
    allocation: plan.allocation,
    allocatedStandardError: plan.allocatedStandardError,
  };
}
