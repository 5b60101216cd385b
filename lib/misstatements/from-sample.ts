import "server-only";
/**
 * The ONE place the summary of misstatements reads a sample's evaluation (lib/samples/evaluate.ts).
 * Each evaluation kind has a reader; a new kind (nonstatistical samples, issue 15) adds its reader
 * to CONTRIBUTION_READERS and nothing else in lib/misstatements changes.
 */
import type { Knex } from "knex";
import type { SampleRecord } from "@/lib/data/samples";
import type { SampleEvaluation } from "@/lib/samples/evaluate";
import type { EvaluationBlock } from "@/lib/samples/evaluation-types";
import { loadSampleWithEvaluation } from "@/lib/samples/context";
import { getAuditorConclusionBySampleId, type AuditorConclusionRecord } from "@/lib/data/auditor-conclusions";
import type { SampleContribution } from "./contribution";
import { cents, dec } from "./money-cents";

type Part = Pick<SampleContribution, "allowance" | "allowanceNote" | "upperLimit" | "basis">;
type Reader = (block: EvaluationBlock, sample: SampleRecord, whole: SampleEvaluation) => Part | null;

export const CONTRIBUTION_READERS: Record<string, Reader> = {
  // Stringer bound: allowance = upper limit − projected (basic precision + incremental allowance) on the tested side(s).
  mus: (b) => {
    if (b.method !== "mus") return null;
    const sides =
      b.direction === "understatement"
        ? [b.understatement]
        : b.direction === "overstatement"
          ? [b.overstatement]
          : [b.overstatement, b.understatement];
    const allowance = sides.map((x) => cents(x.upperLimit) - cents(x.projected)).reduce((a, c) => (c > a ? c : a));
    const upper = sides.map((x) => cents(x.upperLimit)).reduce((a, c) => (c > a ? c : a));
    return {
      allowance: dec(allowance),
      allowanceNote: null,
      upperLimit: dec(upper),
      basis: "monetary-unit (Stringer bound)",
    };
  },
  // Classical estimators: the allowance the interval uses (A′, or A″ when adjusted): limit − projection.
  variables: (b) =>
    b.method === "variables"
      ? { allowance: b.decision.allowance, allowanceNote: null, upperLimit: null, basis: `classical ${b.estimator}` }
      : null,
  stratified: (b) =>
    b.method === "stratified"
      ? { allowance: b.decision.allowance, allowanceNote: null, upperLimit: null, basis: `stratified ${b.estimator}` }
      : null,
  // Nonstatistical: projection + key items + accepted anomalies at actual; no allowance is measured (AS 2315.26).
  nonstatistical: (b) =>
    b.method === "nonstatistical"
      ? {
          allowance: null,
          allowanceNote:
            "No allowance for sampling risk is measured for a nonstatistical sample: the auditor judges it (AS 2315.26; AU-C 530).",
          upperLimit: null,
          basis: `nonstatistical ${b.projection} projection`,
        }
      : null,
  // A test of controls has no monetary misstatement to carry.
  attributes: () => null,
};

/** The amount of the auditor's "conclude the amount is misstated" response, with who and when; null without one. */
export function concludedMisstatementOf(conclusion: AuditorConclusionRecord | null): SampleContribution["concluded"] {
  const response = conclusion?.responses.find((r) => r.kind === "conclude-misstated" && r.amount !== null);
  return conclusion && response?.amount
    ? { amount: response.amount, by: conclusion.writtenBy.name, at: conclusion.writtenAt }
    : null;
}

/** What a sample contributes now, from its evaluation and the auditor's conclusion; `lockedAt` when the sample is locked. */
export function contributionOf(
  sample: SampleRecord,
  populationName: string,
  evaluation: SampleEvaluation,
  lockedAt: string | null,
  concluded: SampleContribution["concluded"] = null,
): SampleContribution {
  const base = {
    sampleId: sample.id,
    name: sample.name,
    account: populationName,
    assertion: sample.assertion,
    direction: sample.direction,
    method: sample.method,
    confidence: evaluation.confidence ?? null,
    complete: evaluation.complete,
    lockedAt,
    factual: "0.00",
    projectedTotal: "0.00",
    allowance: null,
    allowanceNote: null,
    upperLimit: null,
    basis: sample.method,
    concluded,
  };
  if (!evaluation.block) {
    return {
      ...base,
      state: "no-results",
      reason:
        evaluation.progress.done + evaluation.progress.notAuditable === 0
          ? "No results recorded yet."
          : evaluation.computed.statement,
    };
  }
  const reader = CONTRIBUTION_READERS[evaluation.block.method];
  const part = reader ? reader(evaluation.block, sample, evaluation) : null;
  if (!part || evaluation.projectedMisstatement === null) {
    return {
      ...base,
      state: "not-monetary",
      reason: "A test of controls: it carries no monetary misstatement (its deviations inform the assessed risk).",
    };
  }
  return {
    ...base,
    ...part,
    state: "contributes",
    reason: null,
    factual: evaluation.progress.misstatementTotal,
    projectedTotal: dec(cents(evaluation.projectedMisstatement)),
  };
}

/** The projection beyond the items examined: the sample's projected misstatement less what was found. */
export function projectedBeyond(c: SampleContribution): string {
  return dec(cents(c.projectedTotal) - cents(c.factual));
}

/** Loads one sample and its evaluation (the same numbers as its own page) and reads its contribution. */
export async function loadSampleContribution(
  db: Knex,
  { engagementId, sampleId, lockedAt }: { engagementId: number; sampleId: number; lockedAt: string | null },
): Promise<SampleContribution> {
  const [{ view, evaluation }, conclusion] = await Promise.all([
    loadSampleWithEvaluation(db, { engagementId, sampleId }),
    getAuditorConclusionBySampleId(db, { sampleId }),
  ]);
  return contributionOf(view.sample, view.population.name, evaluation, lockedAt, concludedMisstatementOf(conclusion));
}
