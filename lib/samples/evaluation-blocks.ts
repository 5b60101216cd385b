/**
 * The evaluation view model's figures, built once from sample items by calling the engine (rounded
 * to cents only here): the sample page, `GET …/evaluation` and the PDF workpaper print these blocks
 * as they are. Pure (no I/O), so the workpaper fixtures and tests build them too.
 */
import { centsToDecimal, decimalToCents } from "@/lib/money";
import { formatPercent } from "@/lib/format/number";
import { CONTROL_FREQUENCY_LABELS } from "@/lib/validation/sample";
import {
  classicalDecision,
  evaluateAttributes,
  evaluateTwoStageAttributes,
  type TwoStageAttributePlan,
  evaluateMus,
  evaluateStratified,
  evaluateVariables,
  poissonFactor,
  type ClassicalDistribution,
  type Estimator,
  type FactorMode,
  type Sides,
  type StratifiedEstimator,
  type TestDirection,
  type VariablesEvaluation,
} from "@/lib/sampling";
import type {
  AttributesEvaluationBlock,
  ClassicalDecisionFigures,
  Money,
  MusEvaluationBlock,
  StratifiedEvaluationBlock,
  StringerRow,
  StringerSide,
  VariablesEvaluationBlock,
  VariablesResultFigures,
} from "./evaluation-types";
import { describeClassicalRule, describeMusLimits, MUS_UNDERSTATEMENT_CAUTION } from "./evaluation-words";
import { addAtActual, type AtActualInput } from "./evaluation-at-actual";

export interface EvaluatedItem {
  reference: string;
  bookValue: Money;
  auditedValue: Money;
  topStratum?: boolean;
}

/** A number in currency units, rounded to cents, as a decimal string. */
export function money(value: number): Money {
  return centsToDecimal(BigInt(Math.round(value * 100)));
}

const toNumber = (m: Money) => Number(decimalToCents(m)) / 100;
const sumMoney = (values: Money[]) => centsToDecimal(values.reduce((acc, v) => acc + decimalToCents(v), 0n));
const pair = (i: EvaluatedItem) => ({ bookValue: toNumber(i.bookValue), auditedValue: toNumber(i.auditedValue) });

export const MUS_REFERENCES = [
  'Stringer bound as presented in the AICPA Audit Guide "Audit Sampling" and in Leslie, Teitlebaum & Anderson, Dollar-Unit Sampling (1979): basic precision RF(0)·J, projection Σ t_k·J ranked by tainting, incremental allowance Σ (RF(k) − RF(k−1) − 1)·t_k·J.',
  'Reliability factors RF(k): upper confidence limit of a Poisson mean after k events, the gamma(k + 1) quantile at the confidence; "table" mode rounds it up to 2 decimals as the published factor tables. Confidence below 63% is refused: RF(0) drops under 1 there, and lower still the increments RF(k) − RF(k−1) drop under 1.',
  "Gross or net: the firm's methodology setting, stamped on the plan, says whether the upper limit of each direction is compared with TM as it stands (gross, the default) or after deducting the other direction's projected misstatement (net).",
  "Top-stratum items (book value at or above the interval) are examined in full and enter the projection at their actual misstatement, with no allowance.",
];

function stringerSide(
  taintings: { item: EvaluatedItem; t: number }[],
  engineSide: ReturnType<typeof evaluateMus>["overstatement"],
  interval: number,
  factors: number[],
): StringerSide {
  const ranked = [...taintings].sort((a, b) => b.t - a.t);
  ranked.forEach((r, i) => {
    if (Math.abs(r.t - engineSide.taintings[i]) > 1e-12) throw new Error("tainting ranking differs from the engine's");
  });
  const rows: StringerRow[] = ranked.map((r, i) => ({
    rank: i + 1,
    reference: r.item.reference,
    bookValue: r.item.bookValue,
    auditedValue: r.item.auditedValue,
    tainting: r.t,
    factor: factors[i + 1],
    factorIncrement: factors[i + 1] - factors[i],
    projected: money(r.t * interval),
    incrementalAllowance: money((factors[i + 1] - factors[i] - 1) * r.t * interval),
  }));
  return {
    basicPrecisionFactor: factors[0],
    basicPrecision: money(engineSide.basicPrecision),
    rows,
    projectedFromSample: money(engineSide.projected - engineSide.topStratumMisstatement),
    topStratumMisstatement: money(engineSide.topStratumMisstatement),
    projected: money(engineSide.projected),
    incrementalAllowance: money(engineSide.incrementalAllowance),
    upperLimit: money(engineSide.upperLimit),
  };
}

/** Monetary-unit evaluation: `items` are the audited hits (top-stratum items flagged). */
export function buildMusEvaluation(o: {
  interval: number;
  confidence: number;
  factorMode: FactorMode;
  tolerableMisstatement: Money;
  items: EvaluatedItem[];
  direction: TestDirection;
  limits: "gross" | "net";
}): MusEvaluationBlock {
  const sampleItems = o.items.filter((i) => !i.topStratum);
  const topItems = o.items.filter((i) => i.topStratum);
  const result = evaluateMus({
    interval: o.interval,
    confidence: o.confidence,
    sample: sampleItems.map(pair),
    topStratum: topItems.map(pair),
    factors: o.factorMode,
  });
  const withT = sampleItems.map((item) => {
    const book = decimalToCents(item.bookValue);
    return { item, t: Number(book - decimalToCents(item.auditedValue)) / Number(book) };
  });
  const over = withT.filter((x) => x.t > 0);
  const under = withT.filter((x) => x.t < 0).map((x) => ({ item: x.item, t: -x.t }));
  const factors = Array.from({ length: Math.max(over.length, under.length) + 1 }, (_, k) =>
    poissonFactor(k, o.confidence, o.factorMode),
  );
  return {
    method: "mus",
    confidence: o.confidence,
    interval: money(o.interval),
    factorMode: result.factorMode,
    tolerableMisstatement: o.tolerableMisstatement,
    sampleItems: sampleItems.length,
    topStratum: {
      count: topItems.length,
      bookValue: sumMoney(topItems.map((i) => i.bookValue)),
      auditedValue: sumMoney(topItems.map((i) => i.auditedValue)),
    },
    overstatement: stringerSide(over, result.overstatement, o.interval, factors),
    understatement: stringerSide(under, result.understatement, o.interval, factors),
    mostLikelyMisstatement: money(result.mostLikelyMisstatement),
    netUpperLimits: {
      overstatement: money(result.netUpperLimits.overstatement),
      understatement: money(result.netUpperLimits.understatement),
    },
    ...musDecision(result, o),
    warnings: result.warnings,
    formulaReferences: MUS_REFERENCES,
  };
}

function musDecision(
  result: ReturnType<typeof evaluateMus>,
  o: { direction: TestDirection; limits: "gross" | "net"; tolerableMisstatement: Money },
) {
  const limitOf = (d: "overstatement" | "understatement") =>
    money(o.limits === "net" ? result.netUpperLimits[d] : result[d].upperLimit);
  const tests = (d: "overstatement" | "understatement") => o.direction === "both" || o.direction === d;
  const compared = {
    overstatement: tests("overstatement") ? limitOf("overstatement") : null,
    understatement: tests("understatement") ? limitOf("understatement") : null,
  };
  const tm = decimalToCents(o.tolerableMisstatement);
  const supported = [compared.overstatement, compared.understatement].every(
    (v) => v === null || decimalToCents(v) <= tm,
  );
  return {
    direction: o.direction,
    limits: o.limits,
    compared,
    supported,
    statement: describeMusLimits({ compared, limits: o.limits, tolerable: o.tolerableMisstatement, supported }),
    understatementCaution: tests("understatement") ? MUS_UNDERSTATEMENT_CAUTION : null,
  };
}

export const VARIABLES_REFERENCES = [
  "W. G. Cochran, Sampling Techniques, 3rd ed. (1977): mean per unit ch. 2; difference and ratio estimators ch. 6 (ratio variance eq. 6.9); regression estimator ch. 7; stratified estimators ch. 5 and §§6.10–6.11; all with the finite population correction (1 − f), f = n/N.",
  'Decision rule (AICPA Audit Guide "Audit Sampling", classical variables): achieved allowance A′ = z_α·SE with z_α for the planned risk of incorrect rejection, on the sides the plan was sized with; when A′ > A (planned), the adjusted allowance A″ = A′ + TM·(1 − A′/A). The recorded amount is supported when it lies within Ŷ ± the allowance on the side(s) tested.',
  "Student t (when the firm chooses it): n − 1 degrees of freedom, regression n − 2, stratified Satterthwaite's effective degrees of freedom (Biometrics Bulletin 2, 1946).",
];

/** What the classical decision needs from the plan: its direction, risks, planned allowance and z_α sides. */
export interface ClassicalPlanInputs {
  direction: TestDirection;
  riskOfIncorrectRejection: number;
  plannedAllowance: number;
  plannedSides: "two" | "one";
  distribution: ClassicalDistribution;
}

function figures(
  r: VariablesEvaluation,
  o: ClassicalPlanInputs & { confidence: number; tolerableMisstatement: Money; populationBookValue: Money },
): VariablesResultFigures {
  const d = classicalDecision({
    bookValue: toNumber(o.populationBookValue),
    estimatedAuditedValue: r.estimatedAuditedValue,
    standardError: r.standardError,
    tolerableMisstatement: toNumber(o.tolerableMisstatement),
    plannedAllowance: o.plannedAllowance,
    riskOfIncorrectRejection: o.riskOfIncorrectRejection,
    direction: o.direction,
    plannedSides: o.plannedSides,
    distribution: o.distribution,
    degreesOfFreedom: r.degreesOfFreedom,
  });
  const decision: Omit<ClassicalDecisionFigures, "rule"> = {
    direction: o.direction,
    riskOfIncorrectRejection: o.riskOfIncorrectRejection,
    riskOfIncorrectAcceptance: 1 - o.confidence,
    distribution: d.distribution,
    degreesOfFreedom: d.degreesOfFreedom,
    coefficientSides: d.coefficientSides,
    coefficient: d.coefficient,
    plannedAllowance: money(o.plannedAllowance),
    achievedAllowance: money(d.achievedAllowance),
    adjustedAllowance: d.adjustedAllowance === null ? null : money(d.adjustedAllowance),
    allowance: money(d.allowance),
    lowerLimit: Number.isFinite(d.lowerLimit) ? money(d.lowerLimit) : null,
    upperLimit: Number.isFinite(d.upperLimit) ? money(d.upperLimit) : null,
    beyondLimit: money(d.beyondLimit),
    beyond: d.beyond,
    supported: d.supported,
  };
  return {
    estimatedAuditedValue: money(r.estimatedAuditedValue),
    projectedMisstatement: money(r.projectedMisstatement),
    standardError: money(r.standardError),
    misstatementsInSample: r.misstatementsInSample,
    decision: {
      ...decision,
      rule: describeClassicalRule({
        ...decision,
        estimatedAuditedValue: money(r.estimatedAuditedValue),
        standardError: money(r.standardError),
        bookValue: o.populationBookValue,
        tolerableMisstatement: o.tolerableMisstatement,
      }),
    },
  };
}

/**
 * `populationSize`/`populationBookValue` are the estimator's frame: with key items, the remainder
 * outside them; `atActual` brings the key items and accepted anomalies back at their actual amounts.
 */
export function buildVariablesEvaluation(
  o: ClassicalPlanInputs & {
    estimator: Estimator;
    confidence: number;
    sides: Sides;
    tolerableMisstatement: Money;
    populationSize: number;
    populationBookValue: Money;
    items: EvaluatedItem[];
    atActual?: AtActualInput;
  },
): VariablesEvaluationBlock {
  const estimate = evaluateVariables({
    estimator: o.estimator,
    populationSize: o.populationSize,
    populationBookValue: toNumber(o.populationBookValue),
    sample: o.items.map(pair),
    confidence: o.confidence,
    sides: o.sides,
    distribution: o.distribution,
  });
  const whole = addAtActual(estimate, { size: o.populationSize, bookValue: o.populationBookValue }, o.atActual);
  return {
    method: "variables",
    estimator: o.estimator,
    confidence: o.confidence,
    sides: o.sides,
    tolerableMisstatement: o.tolerableMisstatement,
    populationSize: whole.populationSize,
    populationBookValue: whole.populationBookValue,
    sampleSize: o.items.length,
    sampleBookValue: sumMoney(o.items.map((i) => i.bookValue)),
    sampleAuditedValue: sumMoney(o.items.map((i) => i.auditedValue)),
    ...figures(whole.result, { ...o, populationBookValue: whole.populationBookValue }),
    atActual: whole.figures,
    warnings: whole.result.warnings,
    formulaReferences: VARIABLES_REFERENCES,
  };
}

export function buildStratifiedEvaluation(
  o: ClassicalPlanInputs & {
    estimator: StratifiedEstimator;
    confidence: number;
    sides: Sides;
    tolerableMisstatement: Money;
    strata: { label: string; populationSize: number; populationBookValue: Money; items: EvaluatedItem[] }[];
    atActual?: AtActualInput;
  },
): StratifiedEvaluationBlock {
  const estimate = evaluateStratified({
    estimator: o.estimator,
    confidence: o.confidence,
    sides: o.sides,
    distribution: o.distribution,
    strata: o.strata.map((st) => ({
      populationSize: st.populationSize,
      populationBookValue: toNumber(st.populationBookValue),
      sample: st.items.map(pair),
    })),
  });
  const remainder = {
    size: o.strata.reduce((n, st) => n + st.populationSize, 0),
    bookValue: sumMoney(o.strata.map((st) => st.populationBookValue)),
  };
  const whole = addAtActual(estimate, remainder, o.atActual);
  return {
    method: "stratified",
    estimator: o.estimator,
    confidence: o.confidence,
    sides: o.sides,
    tolerableMisstatement: o.tolerableMisstatement,
    populationSize: whole.populationSize,
    populationBookValue: whole.populationBookValue,
    strata: o.strata.map((st, h) => ({
      number: h + 1,
      label: st.label,
      populationSize: st.populationSize,
      populationBookValue: st.populationBookValue,
      sampleSize: st.items.length,
      sampleBookValue: sumMoney(st.items.map((i) => i.bookValue)),
      sampleAuditedValue: sumMoney(st.items.map((i) => i.auditedValue)),
      misstatementsInSample: st.items.filter((i) => decimalToCents(i.bookValue) !== decimalToCents(i.auditedValue))
        .length,
      estimatedAuditedValue: money(estimate.strata[h].estimatedAuditedValue),
      standardError: money(estimate.strata[h].standardError),
    })),
    ...figures(whole.result, { ...o, populationBookValue: whole.populationBookValue }),
    atActual: whole.figures,
    warnings: whole.result.warnings,
    formulaReferences: VARIABLES_REFERENCES,
  };
}

export const ATTRIBUTES_REFERENCES = [
  "Upper deviation limit: one-sided Clopper–Pearson bound, C. J. Clopper & E. S. Pearson, Biometrika 26 (1934), the beta(k + 1, n − k) quantile at the confidence.",
  'Sample size: smallest n with BinomialCDF(⌈EDR·n⌉; n, TDR) ≤ 1 − confidence, which reproduces the AICPA Audit Guide "Audit Sampling" attribute tables.',
];

export const HYPERGEOMETRIC_REFERENCES = [
  "Small population (below the firm's threshold): sampling without replacement, hypergeometric. Size: smallest n with HypergeometricCDF(⌈EDR·n⌉; N, M, n) ≤ 1 − confidence, M = ⌈TDR·N⌉ deviations assumed in the population.",
  "Upper deviation limit: M_U / N, M_U the largest number of population deviations with HypergeometricCDF(k; N, M_U, n) > 1 − confidence (the exact hypergeometric bound).",
];

export const CONTROL_FREQUENCY_REFERENCES = [
  "Size from the firm's control-frequency table (how often the manual control operates → minimum items): firm methodology, not a statistical size. No deviation is expected: any deviation means the test does not support the planned reliance without further work (common practice).",
  "The upper deviation limit is shown for information only: one-sided Clopper–Pearson bound, C. J. Clopper & E. S. Pearson, Biometrika 26 (1934).",
];

export function buildAttributesEvaluation(o: {
  confidence: number;
  tolerableRate: number;
  expectedRate: number;
  sampleSize: number;
  allowedDeviations: number;
  deviations: number;
  limitMode?: "exact" | "table";
  twoStage?: { plan: TwoStageAttributePlan; firstStageDeviations: number; secondStageDeviations?: number };
  /** A plan sized with the hypergeometric distribution on its population of N items is evaluated with it. */
  populationSize?: number;
  controlFrequency?: { frequency: string; minimumSampleSize: number };
}): AttributesEvaluationBlock {
  const r = evaluateAttributes({
    sampleSize: o.sampleSize,
    deviations: o.deviations,
    confidence: o.confidence,
    mode: o.limitMode,
    populationSize: o.controlFrequency ? undefined : o.populationSize,
  });
  const pct = (v: number) => `${(v * 100).toFixed(2)}%`;
  const model = {
    model: r.model,
    populationSize: r.model === "hypergeometric" ? o.populationSize! : null,
    upperDeviations: r.upperDeviations ?? null,
    controlFrequency: null,
  };
  if (o.twoStage)
    return {
      ...twoStageBlock(o, r, o.twoStage),
      ...model,
      formulaReferences: [TWO_STAGE_REFERENCE, ...ATTRIBUTES_REFERENCES],
    };
  if (o.controlFrequency) return controlFrequencyBlock(o, r, o.controlFrequency);
  const supported = r.upperLimit <= o.tolerableRate;
  return {
    method: "attributes",
    confidence: o.confidence,
    tolerableRate: o.tolerableRate,
    expectedRate: o.expectedRate,
    sampleSize: o.sampleSize,
    allowedDeviations: o.allowedDeviations,
    deviations: o.deviations,
    ...model,
    sampleRate: r.sampleRate,
    upperDeviationLimit: r.upperLimit,
    limitMode: r.mode,
    allowanceForSamplingRisk: r.upperLimit - r.sampleRate,
    twoStage: null,
    supported,
    statement: `${o.deviations} deviation${o.deviations === 1 ? "" : "s"} in ${o.sampleSize}: the upper deviation limit ${pct(r.upperLimit)} is ${supported ? "at or below" : "above"} the tolerable deviation rate ${pct(o.tolerableRate)}${o.deviations > o.allowedDeviations ? `; more deviations were found (${o.deviations}) than the plan allowed (${o.allowedDeviations})` : ""}.`,
    warnings: [],
    formulaReferences: r.model === "hypergeometric" ? HYPERGEOMETRIC_REFERENCES : ATTRIBUTES_REFERENCES,
  };
}

/** A control test sized from the firm's frequency table is judged on its deviations: none is expected (common practice). */
function controlFrequencyBlock(
  o: { confidence: number; sampleSize: number; deviations: number },
  r: ReturnType<typeof evaluateAttributes>,
  row: { frequency: string; minimumSampleSize: number },
): AttributesEvaluationBlock {
  const supported = o.deviations === 0;
  const pct = (v: number) => `${(v * 100).toFixed(2)}%`;
  return {
    method: "attributes",
    confidence: o.confidence,
    tolerableRate: 0,
    expectedRate: 0,
    sampleSize: o.sampleSize,
    allowedDeviations: 0,
    deviations: o.deviations,
    model: "binomial",
    populationSize: null,
    upperDeviations: null,
    controlFrequency: row,
    sampleRate: r.sampleRate,
    upperDeviationLimit: r.upperLimit,
    limitMode: r.mode,
    allowanceForSamplingRisk: r.upperLimit - r.sampleRate,
    twoStage: null,
    supported,
    statement: supported
      ? `No deviation in ${o.sampleSize} occurrence${o.sampleSize === 1 ? "" : "s"} tested (the firm's control-frequency table: ${(CONTROL_FREQUENCY_LABELS as Record<string, string>)[row.frequency] ?? row.frequency} → ${row.minimumSampleSize}): the test supports reliance on the control, subject to the auditor's judgement. For information, the upper deviation limit at ${formatPercent(o.confidence)} confidence is ${pct(r.upperLimit)}.`
      : `${o.deviations} deviation${o.deviations === 1 ? "" : "s"} in ${o.sampleSize} occurrences tested from the firm's control-frequency table: a frequency-based test expects none, so it does not support the planned reliance without further work (understand the cause, extend the test or test a compensating control).`,
    warnings: [
      "Sized from the firm's control-frequency table: not a statistical sample; the upper deviation limit is shown for information only.",
    ],
    formulaReferences: CONTROL_FREQUENCY_REFERENCES,
  };
}

export const TWO_STAGE_REFERENCE =
  "Two-stage plan (planned sequential sampling, binomial at the tolerable rate): stage 1 accepts on 0 deviations and rejects on 2 or more; exactly 1 opens stage 2, accepted only with 0 further deviations; risk of overreliance = b(0; n₁) + b(1; n₁)·(1 − TDR)^n₂.";

const TWO_STAGE_WORDS = {
  accept: "the plan's rule supports reliance on the control",
  reject: "the plan's rule does not support reliance on the control",
  continue: "exactly one deviation in stage 1: draw stage 2",
} as const;

function twoStageBlock(
  o: {
    confidence: number;
    tolerableRate: number;
    expectedRate: number;
    sampleSize: number;
    allowedDeviations: number;
    deviations: number;
  },
  r: ReturnType<typeof evaluateAttributes>,
  t: { plan: TwoStageAttributePlan; firstStageDeviations: number; secondStageDeviations?: number },
): Omit<
  AttributesEvaluationBlock,
  "formulaReferences" | "model" | "populationSize" | "upperDeviations" | "controlFrequency"
> {
  const e = evaluateTwoStageAttributes(t);
  const pct = (v: number) => `${(v * 100).toFixed(2)}%`;
  const stage2 =
    t.secondStageDeviations === undefined ? "" : `, stage 2: ${t.secondStageDeviations} in ${t.plan.secondStageSize}`;
  return {
    method: "attributes",
    confidence: o.confidence,
    tolerableRate: o.tolerableRate,
    expectedRate: o.expectedRate,
    sampleSize: o.sampleSize,
    allowedDeviations: o.allowedDeviations,
    deviations: o.deviations,
    sampleRate: r.sampleRate,
    upperDeviationLimit: r.upperLimit,
    limitMode: r.mode,
    allowanceForSamplingRisk: r.upperLimit - r.sampleRate,
    twoStage: {
      firstStageSize: t.plan.firstStageSize,
      secondStageSize: t.plan.secondStageSize,
      riskOfOverreliance: e.riskOfOverreliance,
      firstStageDeviations: t.firstStageDeviations,
      secondStageDeviations: t.secondStageDeviations ?? null,
      stage: e.stage,
      decision: e.decision,
    },
    supported: e.decision === "accept",
    statement: `Two-stage plan (n₁ ${t.plan.firstStageSize}, n₂ ${t.plan.secondStageSize}, risk of overreliance ${pct(e.riskOfOverreliance)} at the tolerable rate ${pct(o.tolerableRate)}): stage 1: ${t.firstStageDeviations} deviation${t.firstStageDeviations === 1 ? "" : "s"} in ${t.plan.firstStageSize}${stage2}; ${TWO_STAGE_WORDS[e.decision]}${e.decision === "continue" ? ` of ${t.plan.secondStageSize} items, which must show no further deviation` : ""}.`,
    warnings: [],
  };
}
