/**
 * One advisor run, start to finish, without I/O: the code the worker thread executes. Kept free of
 * `server-only` and of Next so it runs in a bare worker_threads Worker (and in tests) as is.
 */
import {
  assumeAuditedValues,
  bookSignRisk,
  recommendEstimator,
  simulateEstimators,
  simulateStringer,
  type AdvisorCell,
  type FactorMode,
  type MisstatementScenario,
  type Recommendation,
  type SampledItem,
  type SimulatedEstimator,
  type Sides,
} from "@/lib/sampling";
import { formatCount } from "@/lib/format/number";

export interface AdvisorJob {
  bookValues: number[];
  scenario: MisstatementScenario;
  sampleSizes: number[];
  trials: number;
  seed: number;
  confidence: number;
  sides: Sides;
  /** The plan's own size: the recommendation is made there when it was simulated. */
  plannedSize: number;
  /** Monetary-unit samples add the Stringer bound under PPS selection. */
  includeStringer: boolean;
  factors: FactorMode;
}

export interface AdvisorResult {
  truth: { bookTotal: number; auditedTotal: number; misstatement: number; misstatedItems: number; items: number };
  cells: (AdvisorCell & { interval?: number })[];
  recommendation: Recommendation;
  notes: string[];
}

/** The four evaluation estimators, then the bias-corrected ratio forms as comparison rows (Cochran 1977 §6.8–6.9). */
const VARIABLES: SimulatedEstimator[] = [
  "mean-per-unit",
  "difference",
  "ratio",
  "regression",
  "hartley-ross",
  "jackknife-ratio",
  "beale-ratio",
  "tin-ratio",
];

/** Units of work in a job, for progress: one per trial per estimator group per size. */
export function jobUnits(job: Pick<AdvisorJob, "sampleSizes" | "trials" | "includeStringer">): number {
  return job.sampleSizes.length * job.trials * (job.includeStringer ? 2 : 1);
}

/**
 * Audited values from the scenario (stream `seed`), then for each sample size the variables
 * estimators under simple random sampling (stream seed + 1 + k) and, for PPS, the Stringer bound
 * (stream seed + 101 + k), so every figure is reproducible from the stored seed alone.
 */
export function runAdvisorJob(
  job: AdvisorJob,
  onProgress: (done: number, total: number) => void = () => {},
): AdvisorResult {
  const audited = assumeAuditedValues({ bookValues: job.bookValues, scenario: job.scenario, seed: job.seed });
  const population: SampledItem[] = job.bookValues.map((bookValue, i) => ({ bookValue, auditedValue: audited[i] }));
  let bookCents = 0;
  let auditedCents = 0;
  let misstatedItems = 0;
  let zeroBook = 0;
  for (const p of population) {
    bookCents += Math.round(p.bookValue * 100);
    auditedCents += Math.round(p.auditedValue * 100);
    if (p.auditedValue !== p.bookValue) misstatedItems++;
    if (p.bookValue === 0) zeroBook++;
  }
  const notes: string[] = [];
  // Ratio and regression are defined whenever the sample's book total is not zero, so they are simulated
  // with zero and negative items too; Hartley–Ross needs every y/x, so zero book values leave it out.
  const estimators = zeroBook > 0 ? VARIABLES.filter((e) => e !== "hartley-ross") : VARIABLES;
  if (zeroBook > 0)
    notes.push(
      `The Hartley–Ross estimator was not simulated: ${formatCount(zeroBook)} items have a zero book value (it averages y/x item by item).`,
    );
  const atSize = Math.min(Math.max(job.plannedSize, 1), job.bookValues.length);
  notes.push(...bookSignRisk({ bookValues: job.bookValues, sampleSize: atSize }).warnings);
  if (job.includeStringer)
    notes.push(
      "The variables estimators are simulated under simple random selection; the Stringer bound under systematic PPS selection with the interval book total / n.",
    );

  const total = jobUnits(job);
  let base = 0;
  const cells: AdvisorResult["cells"] = [];
  const seedAt = (offset: number) => (job.seed + offset) % 4294967296;
  job.sampleSizes.forEach((sampleSize, k) => {
    const variables = simulateEstimators({
      population,
      sampleSize,
      trials: job.trials,
      seed: seedAt(1 + k),
      confidence: job.confidence,
      estimators,
      sides: job.sides,
      onProgress: (d) => onProgress(base + d, total),
    });
    base += job.trials;
    for (const e of estimators) cells.push({ estimator: e, sampleSize, performance: variables[e] });
    if (job.includeStringer) {
      const {
        interval,
        topStratumItems: _top,
        ...performance
      } = simulateStringer({
        population,
        sampleSize,
        trials: job.trials,
        seed: seedAt(101 + k),
        confidence: job.confidence,
        sides: job.sides,
        factors: job.factors,
        onProgress: (d) => onProgress(base + d, total),
      });
      base += job.trials;
      cells.push({ estimator: "stringer", sampleSize, performance, interval });
    }
  });
  onProgress(total, total);

  const misstatedShare = population.length === 0 ? 0 : misstatedItems / population.length;
  return {
    truth: {
      bookTotal: bookCents / 100,
      auditedTotal: auditedCents / 100,
      misstatement: (bookCents - auditedCents) / 100,
      misstatedItems,
      items: population.length,
    },
    cells,
    recommendation: recommendEstimator({
      cells,
      confidence: job.confidence,
      trials: job.trials,
      atSize: job.plannedSize,
      misstatedShare,
    }),
    notes,
  };
}
