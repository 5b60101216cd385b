import "server-only";
import { AppError } from "@/lib/errors";
import { ASSESSED_RISK_LEVELS, type SampleParams } from "@/lib/validation/sample";

export type AssessedRisk = (typeof ASSESSED_RISK_LEVELS)[number];

/** The part of the firm's methodology the risk-based sizing reads (rows: RMM; columns: other procedures). */
export interface AssuranceTable {
  version: number;
  assuranceFactors: { factor: number; confidence: number }[][];
}

export { RISK_LEVEL_LABELS as RISK_LABELS } from "@/lib/validation/methodology";

/** How the plan's confidence and assurance factor were set, as the workpaper prints it. */
export interface RiskSizing {
  basis: "risk-assessment" | "confidence-override" | "typed-confidence";
  assessedRisk: AssessedRisk | null;
  otherProceduresRisk: AssessedRisk | null;
  /** The table's factor and confidence for the two risks (null without a risk assessment). */
  tableFactor: number | null;
  tableConfidence: number | null;
  /** What the plan uses. */
  factor: number;
  confidence: number;
  tableVersion: number;
  overrideReason: string | null;
}

/** Assurance factor equivalent to a confidence, −ln(1 − confidence) (common practice: 3.0 ≈ 95 %, 2.3 ≈ 90 %). */
export const factorForConfidence = (confidence: number) => Number((-Math.log(1 - confidence)).toFixed(4));

/**
 * The confidence and assurance factor of a plan: from the two assessed risks through the firm's
 * table, or the typed confidence as an override with its reason (plans made before issue 15 keep
 * their typed confidence).
 */
export function riskSizing(params: SampleParams, table: AssuranceTable): RiskSizing {
  const rmm = params.assessedRisk ?? null,
    other = params.otherProceduresRisk ?? null;
  let cell: { factor: number; confidence: number } | null = null;
  if (rmm && other) {
    cell = table.assuranceFactors[ASSESSED_RISK_LEVELS.indexOf(rmm)]?.[ASSESSED_RISK_LEVELS.indexOf(other)] ?? null;
    if (!cell)
      throw new AppError(
        400,
        "invalid_input",
        "assessedRisk: the firm's assurance-factor table has no cell for these risks",
        { assessedRisk: ["No cell in the firm's table"] },
      );
  }
  const base = {
    assessedRisk: rmm,
    otherProceduresRisk: other,
    tableFactor: cell?.factor ?? null,
    tableConfidence: cell?.confidence ?? null,
    tableVersion: table.version,
  };
  if (params.sizingBasis === "risk-assessment" && cell)
    return {
      ...base,
      basis: "risk-assessment",
      factor: cell.factor,
      confidence: cell.confidence,
      overrideReason: null,
    };
  const basis = params.sizingBasis === "confidence-override" ? "confidence-override" : "typed-confidence";
  return {
    ...base,
    basis,
    factor: factorForConfidence(params.confidence),
    confidence: params.confidence,
    overrideReason: params.confidenceReason ?? null,
  };
}
