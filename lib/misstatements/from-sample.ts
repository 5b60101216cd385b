import "server-only";
/**
 * The ONE place the summary of misstatements reads a sample's evaluation (lib/samples/evaluate.ts).
 * Each evaluation kind has a reader; a new kind (nonstatistical samples, issue 15) adds its reader
 * to CONTRIBUTION_READERS and nothing else in lib/misstatements changes.
 */
import type { Knex } from "knex";
import type { SampleRecord } from "@/lib/data/samples";
import type { MethodEvaluation, SampleEvaluation } from "@/lib/samples/evaluate";
import { loadSampleWithEvaluation } from "@/lib/samples/context";
import type { SampleContribution } from "./contribution";
import { dec, floatToCents, cents } from "./money-cents";

type Part = Pick<SampleContribution, "allowance" | "allowanceNote" | "upperLimit" | "basis">;
type Reader = (evaluation: MethodEvaluation, sample: SampleRecord, whole: SampleEvaluation) => Part | null;

const fromFloat = (v: number) => dec(floatToCents(v));

export const CONTRIBUTION_READERS: Record<string, Reader> = {
  // Stringer bound: allowance = basic precision + incremental allowance on the tested side.
  mus: (e, sample) => {
    if (e.kind !== "mus") return null;
    const side = sample.direction === "understatement" ? e.result.understatement : e.result.overstatement;
    const twoSided = sample.direction !== "overstatement" && sample.direction !== "understatement";
    const other = twoSided ? e.result.understatement : null;
    const allowance = Math.max(side.upperLimit - side.projected, other ? other.upperLimit - other.projected : 0);
    return { allowance: fromFloat(allowance), allowanceNote: null, upperLimit: fromFloat(Math.max(side.upperLimit, other?.upperLimit ?? 0)), basis: "monetary-unit (Stringer bound)" };
  },
  // Classical estimators: the bound on the tested side less the projection in that direction.
  variables: (e, _sample, whole) => {
    if (e.kind !== "variables") return null;
    const projected = whole.projectedMisstatement ?? 0;
    const over = e.misstatementBounds.overstatement === null ? null : e.misstatementBounds.overstatement - projected;
    const under = e.misstatementBounds.understatement === null ? null : e.misstatementBounds.understatement + projected;
    const allowance = Math.max(over ?? 0, under ?? 0);
    return { allowance: fromFloat(allowance), allowanceNote: null, upperLimit: whole.upperBound === null ? null : fromFloat(whole.upperBound), basis: `classical ${e.estimator}` };
  },
  // A test of controls has no monetary misstatement to carry.
  attribute: () => null,
};

/** What a sample contributes now, from its evaluation; `lockedAt` when the sample is locked. */
export function contributionOf(sample: SampleRecord, populationName: string, evaluation: SampleEvaluation, lockedAt: string | null): SampleContribution {
  const base = {
    sampleId: sample.id, name: sample.name, account: populationName, assertion: sample.assertion, direction: sample.direction, method: sample.method,
    confidence: evaluation.confidence ?? null, complete: evaluation.complete, lockedAt,
    factual: "0.00", projectedTotal: "0.00", allowance: null, allowanceNote: null, upperLimit: null, basis: sample.method,
  };
  if (!evaluation.evaluation) {
    return { ...base, state: "no-results", reason: evaluation.progress.done + evaluation.progress.notAuditable === 0 ? "No results recorded yet." : evaluation.conclusion };
  }
  const reader = CONTRIBUTION_READERS[evaluation.evaluation.kind];
  const part = reader ? reader(evaluation.evaluation, sample, evaluation) : null;
  if (!part || evaluation.projectedMisstatement === null) {
    return { ...base, state: "not-monetary", reason: "A test of controls: it carries no monetary misstatement (its deviations inform the assessed risk)." };
  }
  return { ...base, ...part, state: "contributes", reason: null, factual: evaluation.progress.misstatementTotal, projectedTotal: fromFloat(evaluation.projectedMisstatement) };
}

/** The projection beyond the items examined: the sample's projected misstatement less what was found. */
export function projectedBeyond(c: SampleContribution): string {
  return dec(cents(c.projectedTotal) - cents(c.factual));
}

/** Loads one sample and its evaluation (the same numbers as its own page) and reads its contribution. */
export async function loadSampleContribution(db: Knex, { engagementId, sampleId, lockedAt }: { engagementId: number; sampleId: number; lockedAt: string | null }): Promise<SampleContribution> {
  const { view, evaluation } = await loadSampleWithEvaluation(db, { engagementId, sampleId });
  return contributionOf(view.sample, view.population.name, evaluation, lockedAt);
}
