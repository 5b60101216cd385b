import type { AdvisorRequest, AdvisorRunRecord } from "@/lib/data/advisor-runs";
import { ADVISED_ESTIMATOR_LABELS } from "@/lib/sampling/advise";
import { TAINTING_PATTERN_LABELS } from "@/lib/validation/advisor";

const pct = (v: number) => `${(v * 100).toFixed(1)}%`;

/** The assumed misstatements in words, as stored with the run (screen and workpaper say the same). */
export function scenarioInWords(request: Pick<AdvisorRequest, "scenario" | "scenarioSource">): string {
  const { scenario, scenarioSource } = request;
  if (scenario.kind === "pattern") {
    return `${pct(scenario.misstatedShare)} of items misstated; ${TAINTING_PATTERN_LABELS[scenario.tainting].toLowerCase()}; ${pct(scenario.overstatementShare)} of them overstated.`;
  }
  const from =
    scenarioSource.kind === "previous-sample"
      ? `"${scenarioSource.sampleName}" (${scenarioSource.results} results)`
      : "an earlier sample";
  return `Misstatements as found in ${from}: ${pct(scenario.misstatedShare)} of items misstated, taintings drawn from the ${scenario.taintings.length} seen.`;
}

export function boundInWords(request: Pick<AdvisorRequest, "confidence" | "sides">): string {
  const side =
    request.sides === "two"
      ? "two-sided"
      : request.sides === "lower"
        ? "lower bound on audited value (overstatement)"
        : "upper bound on audited value (understatement)";
  return `${pct(request.confidence)} ${side}`;
}

/** The workpaper's block for the advisor run kept with the plan. */
export function methodRationaleBlock(run: AdvisorRunRecord & { keptReason?: string | null }, planVersion: number) {
  const result = run.result!;
  const rec = result.recommendation;
  return {
    runId: run.id,
    ranAt: run.createdAt,
    ranBy: run.createdByName,
    scenario: scenarioInWords(run.request),
    bound: boundInWords(run.request),
    seed: run.request.seed,
    seedSource: run.request.seedSource,
    trials: run.request.trials,
    sampleSizes: run.request.sampleSizes,
    trueAuditedTotal: result.truth.auditedTotal.toFixed(2),
    trueMisstatement: result.truth.misstatement.toFixed(2),
    recommended: rec.recommended === null ? null : ADVISED_ESTIMATOR_LABELS[rec.recommended],
    atSize: rec.sampleSize,
    summary: rec.summary,
    tradeOff: rec.tradeOff ?? null,
    /** Why the run was kept although it recommends another estimator or none (required then). */
    keptReason: run.keptReason ?? null,
    reasons: rec.verdicts.map((v) => v.reason),
    rows: result.cells.map((c) => ({
      sampleSize: c.sampleSize,
      estimator: ADVISED_ESTIMATOR_LABELS[c.estimator],
      recommended: c.sampleSize === rec.sampleSize && c.estimator === rec.recommended,
      bias: c.performance.bias.toFixed(2),
      standardDeviation: c.performance.standardDeviation.toFixed(2),
      rmse: c.performance.rmse.toFixed(2),
      coverage: c.performance.coverage,
      meanAllowance: c.performance.meanAllowance.toFixed(2),
    })),
    coverageFloor: rec.coverageFloor,
    planChanged: run.planVersion !== planVersion,
    notes: result.notes,
  };
}
export type MethodRationaleBlock = ReturnType<typeof methodRationaleBlock>;
