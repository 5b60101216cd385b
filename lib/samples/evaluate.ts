import "server-only";
import { EngineInputError, evaluateAttributes, evaluateMus, evaluateStratified, evaluateVariables, type MusEvaluation, type SampledItem, type Sides, type VariablesEvaluation } from "@/lib/sampling";
import type { SampleRecord } from "@/lib/data/samples";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import type { PopulationRecord } from "@/lib/data/populations";
import { centsToDecimal, decimalToCents } from "@/lib/money";
import { stringerRows, type StringerRow } from "./stringer-table";

export const JUDGEMENT_CAUTION = "These results support, and do not replace, the auditor's professional judgement, the applicable standards (AU-C 530, ISA 530, AS 2315) and the firm's methodology.";

export interface Progress { total: number; done: number; notAuditable: number; notStarted: number; void: number; misstatements: number; misstatementTotal: string; deviations: number }

export type MethodEvaluation =
  | { kind: "mus"; interval: number; factorMode: "exact" | "table"; result: MusEvaluation; rows: { overstatement: StringerRow[]; understatement: StringerRow[] }; topStratumItems: number }
  | { kind: "variables"; estimator: string; sides: Sides; result: VariablesEvaluation; misstatementBounds: { overstatement: number | null; understatement: number | null } }
  | { kind: "attribute"; sampleSize: number; deviations: number; sampleRate: number; upperLimit: number; tolerableRate: number };

export interface SampleEvaluation {
  sampleId: number;
  method: SampleRecord["method"];
  confidence: number;
  tolerableMisstatement: string | null;
  progress: Progress;
  complete: boolean;
  evaluation: MethodEvaluation | null;
  /** What to carry to the summary of misstatements (currency units), when applicable. */
  projectedMisstatement: number | null;
  upperBound: number | null;
  supported: boolean | null;
  conclusion: string;
  warnings: string[];
  caution: string;
}

const evaluated = (it: SampleItemRecord) => it.status === "done" || it.status === "not-auditable";
const toSampled = (it: SampleItemRecord): SampledItem => ({ bookValue: Number(it.bookValue), auditedValue: it.status === "not-auditable" ? 0 : Number(it.auditedValue) });
/** Overstatement is tested with a lower bound on audited value, understatement with an upper one. */
export const sidesFor = (direction: SampleRecord["direction"]): Sides => (direction === "overstatement" ? "lower" : direction === "understatement" ? "upper" : "two");
const fmt = (v: number) => v.toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 });

export function progressOf(items: SampleItemRecord[]): Progress {
  const p: Progress = { total: 0, done: 0, notAuditable: 0, notStarted: 0, void: 0, misstatements: 0, misstatementTotal: "0.00", deviations: 0 };
  let cents = 0n; // exact: misstatements are summed in integer cents
  for (const it of items) {
    if (it.status === "void") { p.void++; continue; }
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

/** The evaluation of a sample from its recorded results: the same numbers for the API, the page and the PDF. */
export function evaluateSample(sample: SampleRecord, population: PopulationRecord, items: SampleItemRecord[], performanceMateriality: string): SampleEvaluation {
  const progress = progressOf(items);
  const active = items.filter((it) => it.status !== "void");
  const done = active.filter(evaluated);
  const tolerable = sample.method === "attribute" ? null : Number(sample.params.tolerableMisstatement ?? performanceMateriality);
  const base = { sampleId: sample.id, method: sample.method, confidence: sample.params.confidence, tolerableMisstatement: tolerable === null ? null : tolerable.toFixed(2), progress, complete: progress.notStarted === 0 && progress.total > 0, caution: JUDGEMENT_CAUTION };
  if (done.length === 0) return { ...base, evaluation: null, projectedMisstatement: null, upperBound: null, supported: null, conclusion: "No results recorded yet.", warnings: [] };
  try {
    const r = sample.method === "mus" ? musPart(sample, done, tolerable!) : sample.method === "attribute" ? attributePart(sample, done) : variablesPart(sample, population, done, tolerable!);
    const provisional = base.complete ? "" : ` Provisional: ${progress.notStarted} of ${progress.total} items have no result yet.`;
    return { ...base, ...r, supported: base.complete ? r.supported : null, conclusion: r.conclusion + provisional };
  } catch (err) {
    if (err instanceof EngineInputError) return { ...base, evaluation: null, projectedMisstatement: null, upperBound: null, supported: null, conclusion: `Not evaluable yet: ${err.message}`, warnings: [err.message] };
    throw err;
  }
}

function musPart(sample: SampleRecord, done: SampleItemRecord[], tolerable: number) {
  const interval = sample.plan.interval!;
  const factors = sample.params.factorMode;
  const result = evaluateMus({ interval, confidence: sample.params.confidence, factors, sample: done.filter((i) => !i.topStratum).map(toSampled), topStratum: done.filter((i) => i.topStratum).map(toSampled) });
  const rows = { overstatement: stringerRows(result.overstatement, interval, sample.params.confidence, factors), understatement: stringerRows(result.understatement, interval, sample.params.confidence, factors) };
  const limits = sample.direction === "understatement" ? [result.understatement.upperLimit] : sample.direction === "overstatement" ? [result.overstatement.upperLimit] : [result.overstatement.upperLimit, result.understatement.upperLimit];
  const upperBound = Math.max(...limits);
  const supported = upperBound <= tolerable;
  const pct = Math.round(sample.params.confidence * 100);
  return {
    evaluation: { kind: "mus" as const, interval, factorMode: factors, result, rows, topStratumItems: done.filter((i) => i.topStratum).length },
    projectedMisstatement: result.mostLikelyMisstatement, upperBound, supported, warnings: result.warnings,
    conclusion: `${supported ? "The sample supports" : "The sample does not support"} the recorded amount at ${pct}% confidence: the upper misstatement limit ${fmt(upperBound)} is ${supported ? "within" : "above"} tolerable misstatement ${fmt(tolerable)}. Carry the projected misstatement of ${fmt(result.mostLikelyMisstatement)} to the summary of misstatements.`,
  };
}

function variablesPart(sample: SampleRecord, population: PopulationRecord, done: SampleItemRecord[], tolerable: number) {
  const sides = sidesFor(sample.direction);
  const confidence = sample.params.confidence;
  const book = Number(population.total);
  let result: VariablesEvaluation;
  if (sample.method === "stratified") {
    const strata = sample.plan.strata!.map((s) => ({ populationSize: s.populationSize, populationBookValue: Number(s.bookValue), sample: done.filter((i) => i.stratum === s.number).map(toSampled) }));
    result = evaluateStratified({ estimator: sample.params.estimator as "mean-per-unit", strata, confidence, sides });
  } else {
    result = evaluateVariables({ estimator: sample.params.estimator as "ratio", populationSize: population.rowCount, populationBookValue: book, sample: done.map(toSampled), confidence, sides });
  }
  const over = sides === "upper" ? null : book - result.lowerBound;
  const under = sides === "lower" ? null : result.upperBound - book;
  const upperBound = Math.max(over ?? -Infinity, under ?? -Infinity);
  const supported = upperBound <= tolerable;
  return {
    evaluation: { kind: "variables" as const, estimator: String(sample.params.estimator), sides, result, misstatementBounds: { overstatement: over, understatement: under } },
    projectedMisstatement: result.projectedMisstatement, upperBound, supported, warnings: result.warnings,
    conclusion: `${supported ? "The sample supports" : "The sample does not support"} the recorded amount of ${fmt(book)} at ${Math.round(confidence * 100)}% confidence: the misstatement bound ${fmt(upperBound)} is ${supported ? "within" : "above"} tolerable misstatement ${fmt(tolerable)}. Carry the projected misstatement of ${fmt(result.projectedMisstatement)} to the summary of misstatements.`,
  };
}

function attributePart(sample: SampleRecord, done: SampleItemRecord[]) {
  const deviations = done.filter((i) => i.deviation || i.status === "not-auditable").length;
  const r = evaluateAttributes({ sampleSize: done.length, deviations, confidence: sample.params.confidence });
  const tolerableRate = sample.params.tolerableRate!;
  const supported = r.upperLimit <= tolerableRate;
  const pct = (v: number) => `${(v * 100).toFixed(2)}%`;
  return {
    evaluation: { kind: "attribute" as const, sampleSize: done.length, deviations, sampleRate: r.sampleRate, upperLimit: r.upperLimit, tolerableRate },
    projectedMisstatement: null, upperBound: r.upperLimit, supported, warnings: [],
    conclusion: `${supported ? "The sample supports" : "The sample does not support"} reliance on the control at ${Math.round(sample.params.confidence * 100)}% confidence: ${deviations} deviation${deviations === 1 ? "" : "s"} in ${done.length}, upper deviation limit ${pct(r.upperLimit)} against a tolerable rate of ${pct(tolerableRate)}.`,
  };
}
