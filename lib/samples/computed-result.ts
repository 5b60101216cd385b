/**
 * The result as computed by Sondage from an evaluation block: one sentence, the rule, and whether a
 * recorded response is called for. Provisional wording until every item has a result.
 */
import { decimalToCents } from "@/lib/money";
import type { ComputedResult, EvaluationBlock } from "./evaluation-types";
import { moneyWords } from "./evaluation-words";
import { formatPercent } from "@/lib/format/number";

/** Sondage's threshold: a limit within 10% of tolerable calls for a recorded response even when supported. */
export const CLOSE_TO_TOLERABLE_SHARE = 0.1;

const pct = (v: number) => `${(v * 100).toFixed(2)}%`;

function ruleOf(block: EvaluationBlock): string {
  switch (block.method) {
    case "mus":
      return `Stringer bound at ${formatPercent(block.confidence)} confidence, ${block.factorMode} factors; ${block.statement}`;
    case "nonstatistical":
      return `Nonstatistical evaluation, no statistical bound: the total projected misstatement compared with tolerable misstatement and with the "well below" amount (${block.wellBelowBasis}); ${block.statement}`;
    case "attributes":
      return block.controlFrequency
        ? `Firm control-frequency table (${block.controlFrequency.frequency} → ${block.controlFrequency.minimumSampleSize}): no deviation expected; ${block.statement}`
        : block.twoStage
          ? `Two-stage plan rule (accept on 0 deviations in stage 1, reject on 2 or more, 1 opens stage 2 accepted only on 0 more); ${block.statement}`
          : `One-sided Clopper–Pearson upper deviation limit at ${formatPercent(block.confidence)} confidence compared with the tolerable deviation rate; ${block.statement}`;
    default:
      return block.decision.rule;
  }
}

/** The figures so far, for the provisional sentence. */
function soFar(block: EvaluationBlock): string {
  switch (block.method) {
    case "mus": {
      const parts = (["overstatement", "understatement"] as const).flatMap((d) =>
        block.compared[d] === null ? [] : [`${d} ${moneyWords(block.compared[d])}`],
      );
      return `the upper misstatement limit so far (${block.limits}) is ${parts.join(", ")} against tolerable misstatement ${moneyWords(block.tolerableMisstatement)}`;
    }
    case "nonstatistical":
      return `the total projected misstatement so far is ${moneyWords(block.totalProjected)} (projection ${moneyWords(block.projectedMisstatement)}, key items ${moneyWords(block.keyItems.misstatement)}) against tolerable misstatement ${moneyWords(block.tolerableMisstatement)}`;
    case "attributes":
      return block.controlFrequency
        ? `${block.deviations} deviation${block.deviations === 1 ? "" : "s"} so far; a frequency-based test expects none`
        : `${block.deviations} deviation${block.deviations === 1 ? "" : "s"} so far; the upper deviation limit so far is ${pct(block.upperDeviationLimit)} against a tolerable rate of ${pct(block.tolerableRate)}`;
    default:
      return `the projected misstatement so far is ${moneyWords(block.projectedMisstatement)}, with a standard error of ${moneyWords(block.standardError)} and an allowance of ${moneyWords(block.decision.allowance)}`;
  }
}

function isClose(block: EvaluationBlock): boolean {
  switch (block.method) {
    // The firm's "well below" amount already decides how close to tolerable a supporting total may be.
    case "nonstatistical":
      return false;
    case "attributes":
      return block.twoStage || block.controlFrequency
        ? false
        : block.upperDeviationLimit >= (1 - CLOSE_TO_TOLERABLE_SHARE) * block.tolerableRate;
    case "mus": {
      const tm = Number(decimalToCents(block.tolerableMisstatement));
      return [block.compared.overstatement, block.compared.understatement].some(
        (v) => v !== null && Number(decimalToCents(v)) >= (1 - CLOSE_TO_TOLERABLE_SHARE) * tm,
      );
    }
    default: {
      const d = block.decision;
      const tm = Number(block.tolerableMisstatement);
      const bv = Number(block.populationBookValue);
      const margins = [
        d.upperLimit === null ? null : Number(d.upperLimit) - bv,
        d.lowerLimit === null ? null : bv - Number(d.lowerLimit),
      ];
      return margins.some((m) => m !== null && m < CLOSE_TO_TOLERABLE_SHARE * tm);
    }
  }
}

export function computedResultOf(o: {
  block: EvaluationBlock | null;
  progress: { total: number; done: number; notAuditable: number };
  complete: boolean;
  notEvaluable?: string;
}): ComputedResult {
  const withResult = o.progress.done + o.progress.notAuditable;
  if (o.notEvaluable)
    return {
      status: "not-evaluable",
      supported: null,
      statement: `Not evaluable yet: ${o.notEvaluable}`,
      rule: "",
      responseNeeded: false,
    };
  if (!o.block)
    return {
      status: "no-results",
      supported: null,
      statement: "No results recorded yet.",
      rule: "",
      responseNeeded: false,
    };
  const rule = ruleOf(o.block);
  if (o.complete && o.block.method === "attributes" && o.block.twoStage?.decision === "continue") {
    return {
      status: "provisional",
      supported: null,
      statement: `Provisional, on ${withResult} of ${o.progress.total} items: ${o.block.statement}`,
      rule,
      responseNeeded: false,
    };
  }
  if (!o.complete) {
    return {
      status: "provisional",
      supported: null,
      statement: `Provisional, on ${withResult} of ${o.progress.total} items: ${soFar(o.block)}. No result is stated until every item has one.`,
      rule,
      responseNeeded: false,
    };
  }
  const supported =
    o.block.method === "mus" || o.block.method === "attributes" || o.block.method === "nonstatistical"
      ? o.block.supported
      : o.block.decision.supported;
  const what = o.block.method === "attributes" ? "reliance on the control" : "the recorded amount";
  const close = supported && isClose(o.block);
  const statement =
    o.block.method === "nonstatistical"
      ? `Computed by Sondage: the sample ${supported ? "supports" : "does not support"} ${what} — a nonstatistical evaluation, which claims no confidence level${o.block.verdict === "approaches" ? ": the total projected misstatement is below tolerable misstatement but not well below it" : ""}.`
      : `Computed by Sondage: the sample ${supported ? "supports" : "does not support"} ${what} at ${formatPercent(o.block.confidence)} confidence${close ? ", with the limit close to tolerable" : ""}.`;
  return {
    status: supported ? "supported" : "not-supported",
    supported,
    statement,
    rule,
    responseNeeded: !supported || close,
  };
}
