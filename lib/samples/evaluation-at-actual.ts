/**
 * Key items and accepted anomalies in a classical evaluation: the estimator runs on the remainder
 * (the items outside the key items, anomalies taken as unmisstated), and their actual misstatement
 * is added to the estimate afterwards (PCAOB AS 2315.26: items examined 100 percent are not part of
 * the sample; ISA 530 ¶13 / AU-C 530.13: an anomaly is excluded from the projection). Pure.
 */
import { centsToDecimal, decimalToCents } from "@/lib/money";
import type { VariablesEvaluation } from "@/lib/sampling";
import type { AtActualFigures, Money } from "./evaluation-types";

export interface AtActualInput {
  /** Every key item, at its audited value (at book value until it has a result). */
  keyItems: { bookValue: Money; auditedValue: Money }[];
  /** Accepted anomalies at their actual audited value (they enter the estimator as unmisstated). */
  anomalies: { bookValue: Money; auditedValue: Money }[];
}

const cents = (m: Money) => decimalToCents(m);
const sum = (xs: bigint[]) => xs.reduce((a, b) => a + b, 0n);
const units = (c: bigint) => Number(c) / 100;

/**
 * The estimator's result for the whole population: Ŷ = Ŷ(remainder) + key items' audited value −
 * anomalies' misstatement; projected misstatement and both bounds move with it; the standard error
 * is the remainder's (items at actual carry no sampling error).
 */
export function addAtActual<T extends VariablesEvaluation>(
  r: T,
  remainder: { size: number; bookValue: Money },
  at: AtActualInput | undefined,
) {
  if (!at) {
    return {
      result: r,
      figures: null as AtActualFigures | null,
      populationSize: remainder.size,
      populationBookValue: remainder.bookValue,
    };
  }
  const keyBook = sum(at.keyItems.map((i) => cents(i.bookValue)));
  const keyAudited = sum(at.keyItems.map((i) => cents(i.auditedValue)));
  const anomalyMis = sum(at.anomalies.map((i) => cents(i.bookValue) - cents(i.auditedValue)));
  const shift = units(keyAudited - anomalyMis);
  const added = units(keyBook - keyAudited + anomalyMis);
  const result: T = {
    ...r,
    estimatedAuditedValue: r.estimatedAuditedValue + shift,
    projectedMisstatement: r.projectedMisstatement + added,
    lowerBound: r.lowerBound + shift,
    upperBound: r.upperBound + shift,
    warnings: [
      ...r.warnings,
      `Key items and accepted anomalies add ${centsToDecimal(keyBook - keyAudited + anomalyMis)} of actual misstatement to the remainder's projection and move both limits by it.`,
    ],
  };
  const figures: AtActualFigures = {
    remainderSize: remainder.size,
    remainderBookValue: remainder.bookValue,
    remainderEstimatedAuditedValue: centsToDecimal(BigInt(Math.round(r.estimatedAuditedValue * 100))),
    remainderProjectedMisstatement: centsToDecimal(BigInt(Math.round(r.projectedMisstatement * 100))),
    keyItems: {
      count: at.keyItems.length,
      bookValue: centsToDecimal(keyBook),
      auditedValue: centsToDecimal(keyAudited),
      misstatement: centsToDecimal(keyBook - keyAudited),
    },
    anomalies: { count: at.anomalies.length, misstatement: centsToDecimal(anomalyMis) },
  };
  return {
    result,
    figures,
    populationSize: remainder.size + at.keyItems.length,
    populationBookValue: centsToDecimal(cents(remainder.bookValue) + keyBook),
  };
}
