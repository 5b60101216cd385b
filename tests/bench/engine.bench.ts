/**
 * Engine benchmark: `npm run bench:engine` (tsx tests/bench/engine.bench.ts).
 *
 * For 1,000,000 items: selectPps, selectRandom (n = 400) and a baseline single pass that only sums
 * the same values, each the median of several runs with its ratio to the baseline. When python3
 * with numpy is available, the same data are selected by a vectorised numpy implementation of the
 * same contract (tests/bench/engine-numpy.py), the selections are compared and our/numpy ratios
 * printed. Also times simulateEstimators (10,000 trials × every estimator — the four evaluation
 * estimators and the four bias-corrected ratio forms — × n = 200, 100,000 items), musConfidenceFactor
 * over 1,000 ratio × confidence cells (against one gamma quantile per cell, measured in the same run)
 * and a hypergeometric attribute size for N = 5,000 (against the binomial size for the same inputs).
 * Goals: both selections within 2× of numpy; the simulation under 2 s.
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import {
  attributeSampleSize,
  createRng,
  musConfidenceFactor,
  selectPps,
  selectRandom,
  simulateEstimators,
  SIMULATED_ESTIMATORS,
  type SampledItem,
} from "../../lib/sampling";
import { gammaQuantile } from "../../lib/sampling/quantiles";

const N = 1_000_000;
const SAMPLE_SIZE = 400;
const SEED = 20240101;
const RUNS = 9;

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

function time<T>(fn: () => T, runs = RUNS): { ms: number; result: T } {
  let result = fn(); // warm-up
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    result = fn();
    times.push(performance.now() - t);
  }
  return { ms: median(times), result };
}

/** Invented ledger: skewed positive amounts in cents, with about 1% zero and 1% credit items. */
function ledger(): number[] {
  const rng = createRng(7);
  return Array.from({ length: N }, () => {
    const u = rng.nextDouble();
    const amount = Math.round(Math.exp(3 + 6 * rng.nextDouble()) * 100) / 100;
    return u < 0.01 ? 0 : u < 0.02 ? -amount : amount;
  });
}

function findPython(): string | undefined {
  for (const candidate of ["/usr/bin/python3", "python3"]) {
    try {
      execFileSync(candidate, ["-c", "import numpy"], { stdio: "ignore" });
      return candidate;
    } catch {
      /* try the next one */
    }
  }
  return undefined;
}

function main(): void {
  const book = ledger();
  const positiveTotal = book.reduce((sum, v) => (v > 0 ? sum + Math.round(v * 100) : sum), 0) / 100;
  const interval = Math.floor(positiveTotal / SAMPLE_SIZE);

  const baseline = time(() => {
    let sum = 0;
    for (let i = 0; i < book.length; i++) sum += book[i];
    return sum;
  });
  const pps = time(() => selectPps({ bookValues: book, interval, seed: SEED }));
  const random = time(() => selectRandom({ populationSize: N, sampleSize: SAMPLE_SIZE, seed: SEED }));

  const rows: [string, number, string, string][] = [
    ["baseline: one pass summing 1M values", baseline.ms, "1.00", ""],
    [`selectPps (1M items, ${pps.result.hits.length} hits)`, pps.ms, (pps.ms / baseline.ms).toFixed(2), ""],
    [`selectRandom (1M items, n = ${SAMPLE_SIZE})`, random.ms, (random.ms / baseline.ms).toFixed(2), ""],
  ];

  const python = findPython();
  let numpyNote = "numpy: not available (python3 with numpy not found)";
  if (python) {
    const dir = mkdtempSync(path.join(tmpdir(), "sondage-bench-"));
    try {
      const file = path.join(dir, "book.f64");
      writeFileSync(file, Buffer.from(new Float64Array(book).buffer));
      const script = path.join(import.meta.dirname, "engine-numpy.py");
      const out = JSON.parse(
        execFileSync(python, [script, file, String(SEED), String(SAMPLE_SIZE), String(interval), String(RUNS)], {
          encoding: "utf8",
          maxBuffer: 64 * 1024 * 1024,
        }),
      );
      const sameRandom = JSON.stringify(out.random) === JSON.stringify(random.result);
      const ourItems = pps.result.hits.map((h) => h.index);
      const ourCounts = pps.result.hits.map((h) => h.hitPoints.length);
      const samePps =
        JSON.stringify(out.ppsItems) === JSON.stringify(ourItems) &&
        JSON.stringify(out.ppsCounts) === JSON.stringify(ourCounts);
      rows[1][3] = `numpy ${out.ppsMs.toFixed(2)} ms, ours/numpy ${(pps.ms / out.ppsMs).toFixed(2)}, same hits: ${samePps}`;
      rows[2][3] = `numpy ${out.randomMs.toFixed(2)} ms, ours/numpy ${(random.ms / out.randomMs).toFixed(2)}, same sample: ${sameRandom}`;
      numpyNote = `numpy ${out.numpy} via ${python} (RandomState.random_sample + argpartition; cumsum + searchsorted)`;
      if (!sameRandom || !samePps) process.exitCode = 1;
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }

  const rng = createRng(11);
  const population: SampledItem[] = Array.from({ length: 100_000 }, () => {
    const bookValue = Math.round((20 + 5000 * rng.nextDouble() ** 2) * 100) / 100;
    const auditedValue =
      rng.nextDouble() < 0.1 ? Math.round(bookValue * (0.5 + 0.5 * rng.nextDouble()) * 100) / 100 : bookValue;
    return { bookValue, auditedValue };
  });
  const four = time(
    () =>
      simulateEstimators({
        population,
        sampleSize: 200,
        trials: 10_000,
        seed: SEED,
        confidence: 0.95,
        estimators: ["mean-per-unit", "difference", "ratio", "regression"],
      }),
    3,
  );
  const simulation = time(
    () =>
      simulateEstimators({
        population,
        sampleSize: 200,
        trials: 10_000,
        seed: SEED,
        confidence: 0.95,
        estimators: [...SIMULATED_ESTIMATORS],
      }),
    3,
  );
  rows.push([
    "simulateEstimators (100k items, 10,000 trials × 4 × n = 200)",
    four.ms,
    "",
    "reference: the four evaluation estimators",
  ]);
  rows.push([
    `simulateEstimators (100k items, 10,000 trials × ${SIMULATED_ESTIMATORS.length} × n = 200)`,
    simulation.ms,
    "",
    `× the 4-estimator run ${(simulation.ms / four.ms).toFixed(2)}; goal < 2000 ms: ${simulation.ms < 2000 ? "met" : "NOT met"}`,
  ]);
  rows.push(...planningRows());

  console.log(`Sondage engine benchmark — Node ${process.version}, median of ${RUNS} runs (simulation: 3)`);
  console.log(numpyNote);
  console.log("-".repeat(130));
  console.log(`${"case".padEnd(62)}${"ms".padStart(10)}${"× base".padStart(9)}  comparison`);
  console.log("-".repeat(130));
  for (const [name, ms, ratio, note] of rows)
    console.log(`${name.padEnd(62)}${ms.toFixed(2).padStart(10)}${ratio.padStart(9)}  ${note}`);
}

/** musConfidenceFactor over 1,000 cells and a hypergeometric size at N = 5,000, each beside a reference from the same run. */
function planningRows(): [string, number, string, string][] {
  const confidences = Array.from({ length: 40 }, (_, i) => 0.5 + (0.49 * i) / 39);
  const ratios = Array.from({ length: 25 }, (_, j) => (0.9 * j) / 25);
  const factors = time(() => {
    let sum = 0;
    for (const confidence of confidences)
      for (const expectedToTolerable of ratios) sum += musConfidenceFactor({ confidence, expectedToTolerable });
    return sum;
  });
  const quantiles = time(() => {
    let sum = 0;
    for (const confidence of confidences) for (const r of ratios) sum += gammaQuantile(confidence, 1 + 3 * r);
    return sum;
  });
  const hyper = time(() =>
    attributeSampleSize({ tolerableRate: 0.05, expectedRate: 0.01, confidence: 0.95, populationSize: 5000 }),
  );
  const binomial = time(() => attributeSampleSize({ tolerableRate: 0.05, expectedRate: 0.01, confidence: 0.95 }));
  return [
    ["reference: 1,000 gamma quantiles (one per cell)", quantiles.ms, "", ""],
    [
      "musConfidenceFactor, 1,000 ratio × confidence cells (exact root)",
      factors.ms,
      "",
      `× one quantile per cell ${(factors.ms / quantiles.ms).toFixed(1)}`,
    ],
    [`reference: binomial attribute size (TDR 5%, EDR 1%, 95%) → ${binomial.result.sampleSize}`, binomial.ms, "", ""],
    [
      `hypergeometric attribute size, N = 5,000 (same inputs) → ${hyper.result.sampleSize}`,
      hyper.ms,
      "",
      `× the binomial size ${(hyper.ms / binomial.ms).toFixed(1)}`,
    ],
  ];
}

main();
