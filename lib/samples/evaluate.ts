import "server-only";
import type { SampleRecord } from "@/lib/data/samples";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import type { PopulationRecord } from "@/lib/data/populations";
import { centsToDecimal, decimalToCents } from "@/lib/money";
import { EngineInputError, type Sides } from "@/lib/sampling";
import type { ComputedResult, EvaluationBlock, Money } from "./evaluation-types";
import {
  buildAttributesEvaluation,
  buildMusEvaluation,
  buildStratifiedEvaluation,
  buildVariablesEvaluation,
  type EvaluatedItem,
} from "./evaluation-blocks";
import { computedResultOf } from "./computed-result";
import { unauditableAuditedValue } from "./item-misstatement";
import { UNAUDITABLE_ON_ROW, UNAUDITABLE_TREATMENT } from "./evaluation-words";
import { evaluationSettingsOf } from "./evaluation-settings";
import { methodologyOfSample } from "./methodology";
import { buildNonstatisticalEvaluation } from "./evaluation-block-nonstatistical";
import type { AtActualInput } from "./evaluation-at-actual";
import { CONTROL_FREQUENCY_LABELS } from "@/lib/validation/sample";

export const JUDGEMENT_CAUTION =
  "These results support, and do not replace, the auditor's professional judgement, the applicable standards (AU-C 530, ISA 530, AS 2315; AU-C 450, ISA 450) and the firm's methodology.";

export interface Progress {
  total: number;
  done: number;
  notAuditable: number;
  notStarted: number;
  void: number;
  misstatements: number;
  misstatementTotal: string;
  deviations: number;
}

/**
 * The evaluation view model of a sample: built once here and printed as it is by the sample page,
 * `GET …/evaluation` and the PDF workpaper.
 */
export interface SampleEvaluation {
  sampleId: number;
  method: SampleRecord["method"];
  direction: SampleRecord["direction"];
  confidence: number;
  tolerableMisstatement: Money | null;
  progress: Progress;
  complete: boolean;
  /** The method's figures and rows; null before any result (or when not yet evaluable). */
  block: EvaluationBlock | null;
  /** The result as computed by Sondage, with its rule; never the auditor's conclusion. */
  computed: ComputedResult;
  /** What to carry to the summary of misstatements (currency units), when applicable. */
  projectedMisstatement: Money | null;
  /** How items that could not be audited are treated, and method cautions. */
  notes: string[];
  /** notes[0] in a few words, for the row of each item marked "could not be audited". */
  unauditableOnRow: string;
  warnings: string[];
  caution: string;
}

const evaluated = (it: SampleItemRecord) => it.status === "done" || it.status === "not-auditable";
/** Overstatement is tested with a lower bound on audited value, understatement with an upper one. */
export const sidesFor = (direction: SampleRecord["direction"]): Sides =>
  direction === "overstatement" ? "lower" : direction === "understatement" ? "upper" : "two";

/** An item that could not be audited is fully misstated in the direction tested (audited 0 for over, 2 × book for under). */
export function auditedForEvaluation(it: SampleItemRecord, direction: SampleRecord["direction"]): Money {
  if (it.status !== "not-auditable") return it.auditedValue ?? it.bookValue;
  return unauditableAuditedValue(it.bookValue, direction);
}

export function progressOf(items: SampleItemRecord[]): Progress {
  const p: Progress = {
    total: 0,
    done: 0,
    notAuditable: 0,
    notStarted: 0,
    void: 0,
    misstatements: 0,
    misstatementTotal: "0.00",
    deviations: 0,
  };
  let cents = 0n; // exact: misstatements are summed in integer cents
  for (const it of items) {
    if (it.status === "void") {
      p.void++;
      continue;
    }
    p.total++;
    if (it.status === "done") p.done++;
    else if (it.status === "not-auditable") p.notAuditable++;
    else p.notStarted++;
    if (it.deviation) p.deviations++;
    if (it.misstatement !== null && it.misstatement !== "0.00") {
      p.misstatements++;
      cents += decimalToCents(it.misstatement);
    }
  }
  p.misstatementTotal = centsToDecimal(cents);
  return p;
}

/** The evaluation view model of a sample from its recorded results. */
export function evaluateSample(
  sample: SampleRecord,
  population: PopulationRecord,
  items: SampleItemRecord[],
  performanceMateriality: string,
): SampleEvaluation {
  const progress = progressOf(items);
  const active = items.filter((it) => it.status !== "void");
  const done = active.filter(evaluated);
  const tolerable =
    sample.method === "attribute"
      ? null
      : centsToDecimal(decimalToCents(String(sample.params.tolerableMisstatement ?? performanceMateriality)));
  const complete = progress.notStarted === 0 && progress.total > 0;
  const treatment = sample.method === "attribute" ? "attribute" : sample.direction;
  const notes = [UNAUDITABLE_TREATMENT[treatment]];
  if (sample.method === "mus" && active.some((it) => it.anomaly)) notes.push(MUS_IGNORES_ANOMALIES);
  const base = {
    sampleId: sample.id,
    method: sample.method,
    direction: sample.direction,
    confidence: sample.params.confidence,
    tolerableMisstatement: tolerable,
    progress,
    complete,
    notes,
    unauditableOnRow: UNAUDITABLE_ON_ROW[treatment],
    caution: JUDGEMENT_CAUTION,
  };
  if (done.length === 0)
    return {
      ...base,
      block: null,
      computed: computedResultOf({ block: null, progress, complete }),
      projectedMisstatement: null,
      warnings: [],
    };
  try {
    const block = blockFor(sample, population, active, tolerable);
    const projected =
      block.method === "mus"
        ? block.mostLikelyMisstatement
        : block.method === "attributes"
          ? null
          : block.method === "nonstatistical"
            ? block.totalProjected
            : block.projectedMisstatement;
    return {
      ...base,
      block,
      computed: computedResultOf({ block, progress, complete }),
      projectedMisstatement: projected,
      warnings: block.warnings,
    };
  } catch (err) {
    if (err instanceof EngineInputError)
      return {
        ...base,
        block: null,
        computed: computedResultOf({ block: null, progress, complete, notEvaluable: err.message }),
        projectedMisstatement: null,
        warnings: [err.message],
      };
    throw err;
  }
}

export const MUS_IGNORES_ANOMALIES =
  "Items marked anomalous are evaluated like any other: the Stringer bound has no provision for anomalous misstatements, so a monetary-unit evaluation ignores the mark.";

/** An anomaly counts only once a manager or partner has accepted it, and only where the firm's methodology allows anomalies. */
export const acceptedAnomaly = (it: SampleItemRecord, allowed: boolean) => allowed && Boolean(it.anomaly?.acceptedAt);

function blockFor(
  sample: SampleRecord,
  population: PopulationRecord,
  active: SampleItemRecord[],
  tolerable: Money | null,
): EvaluationBlock {
  const p = sample.params;
  const settings = evaluationSettingsOf(sample);
  const done = active.filter(evaluated);
  const item = (it: SampleItemRecord): EvaluatedItem => ({
    reference: it.itemRef,
    bookValue: it.bookValue,
    auditedValue: auditedForEvaluation(it, sample.direction),
    topStratum: it.topStratum,
  });
  const anomaliesAllowed = methodologyOfSample(sample).anomaliesAllowed;
  const isAnomaly = (it: SampleItemRecord) => acceptedAnomaly(it, anomaliesAllowed);
  if (sample.method === "nonstatistical") {
    const ns = sample.plan.nonstatistical!;
    const key = sample.plan.keyItems ?? null;
    return buildNonstatisticalEvaluation({
      projection: ns.projection,
      direction: sample.direction,
      sample: done.filter((i) => !i.keyItem).map((i) => ({ ...item(i), anomaly: isAnomaly(i) })),
      keyItems: done.filter((i) => i.keyItem).map(item),
      keyItemsPlanned: key?.count ?? 0,
      remainder: {
        count: key?.remainder.count ?? sample.plan.frameSize,
        bookValue: key?.remainder.total ?? sample.plan.frameTotal,
      },
      tolerableMisstatement: tolerable!,
      expectedMisstatement: ns.expectedMisstatement,
      wellBelow: ns.wellBelow,
      haphazard: ns.selection === "haphazard",
    });
  }
  if (sample.method === "attribute") {
    const deviates = (i: SampleItemRecord) => Boolean(i.deviation) || i.status === "not-auditable";
    const deviations = done.filter(deviates).length;
    const row = sample.plan.controlFrequencyRow;
    const common = {
      confidence: p.confidence,
      tolerableRate: p.tolerableRate ?? 0,
      expectedRate: p.expectedRate,
      sampleSize: done.length,
      allowedDeviations: sample.plan.allowedDeviations ?? 0,
      deviations,
      populationSize: sample.plan.model === "hypergeometric" ? sample.plan.frameSize : undefined,
      controlFrequency: row
        ? { frequency: CONTROL_FREQUENCY_LABELS[row.frequency], minimumSampleSize: row.minimumSampleSize }
        : undefined,
    };
    const plan = sample.plan.twoStage;
    if (!plan) return buildAttributesEvaluation(common);
    const stage2 = done.filter((i) => i.origin === "extension");
    return buildAttributesEvaluation({
      ...common,
      twoStage: {
        plan,
        firstStageDeviations: done.filter((i) => i.origin !== "extension" && deviates(i)).length,
        secondStageDeviations: stage2.length > 0 ? stage2.filter(deviates).length : undefined,
      },
    });
  }
  if (sample.method === "mus") {
    return buildMusEvaluation({
      interval: sample.plan.interval!,
      confidence: p.confidence,
      factorMode: settings.factorMode,
      tolerableMisstatement: tolerable!,
      items: done.map(item),
      direction: sample.direction,
      limits: settings.musLimits,
    });
  }
  const planned = Number(sample.plan.inputs.A);
  if (!(planned > 0))
    throw new EngineInputError("plannedAllowance", "plannedAllowance is missing from the plan; plan the sample again");
  const classical = {
    direction: sample.direction,
    riskOfIncorrectRejection: p.riskOfIncorrectRejection,
    plannedAllowance: planned,
    plannedSides: sample.plan.sides ?? "two",
    distribution: settings.classicalDistribution,
  } as const;
  const common = {
    ...classical,
    estimator: p.estimator as never,
    confidence: p.confidence,
    sides: sidesFor(sample.direction),
    tolerableMisstatement: tolerable!,
  };
  // Key items (every one, at book until it has a result) and accepted anomalies are taken at actual, outside the estimator.
  const key = sample.plan.keyItems ?? null;
  const outside = done.filter((i) => !i.keyItem);
  const asSampled = (i: SampleItemRecord): EvaluatedItem =>
    isAnomaly(i) ? { ...item(i), auditedValue: i.bookValue } : item(i);
  const atActual: AtActualInput | undefined =
    key || done.some(isAnomaly)
      ? {
          keyItems: active
            .filter((i) => i.keyItem)
            .map((i) => (evaluated(i) ? item(i) : { ...item(i), auditedValue: i.bookValue })),
          anomalies: outside.filter(isAnomaly).map(item),
        }
      : undefined;
  if (sample.method === "stratified") {
    return buildStratifiedEvaluation({
      ...common,
      atActual,
      strata: sample.plan.strata!.map((s) => ({
        label: s.label,
        populationSize: s.populationSize,
        populationBookValue: s.bookValue,
        items: outside.filter((i) => i.stratum === s.number).map(asSampled),
      })),
    });
  }
  return buildVariablesEvaluation({
    ...common,
    atActual,
    populationSize: key ? key.remainder.count : population.rowCount,
    populationBookValue: key ? key.remainder.total : population.total,
    items: outside.map(asSampled),
  });
}
