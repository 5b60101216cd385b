import type { z } from "zod";
import type { PlanSampleSchema } from "@/lib/validation/sample";
import { fractionToPercent, percentToFraction } from "./labels";
import { textOf } from "@/lib/format/text";
import { planKeysFor } from "@/lib/validation/plan-keys";

export type PlanFormIn = z.input<typeof PlanSampleSchema>;
export type PlanFormOut = z.output<typeof PlanSampleSchema>;

/** Parameters the auditor types as percents; the API and the engine take fractions. */
export const PERCENT_FIELDS = ["confidence", "riskOfIncorrectRejection", "tolerableRate", "expectedRate"] as const;

export interface PopulationChoice {
  id: number;
  name: string;
  rowCount: number;
  total: string;
  status: "loading" | "unreconciled" | "reconciled" | "superseded";
  positive: { count: number; total: string };
}

/** Rounds a suggested band boundary to two significant figures (e.g. 1,234.56 → 1,200). */
function roundBoundary(v: number): string {
  if (v <= 1) return "1.00";
  const p = 10 ** (Math.floor(Math.log10(v)) - 1);
  return (Math.round(v / p) * p).toFixed(2);
}

/** A starting point for stratified bands: around the mean item and four times it; the auditor edits them. */
export function suggestedBounds(p: PopulationChoice | undefined): string[] {
  if (!p || p.positive.count === 0) return ["1000.00", "10000.00"];
  const mean = Number(p.positive.total) / p.positive.count;
  return [roundBoundary(mean), roundBoundary(mean * 4)];
}

export function defaultPlanValues(performanceMateriality: string, populationId?: number): PlanFormIn {
  return {
    populationId: populationId ?? "",
    name: "",
    objective: "",
    assertion: "",
    direction: "overstatement",
    params: {
      method: "mus",
      estimator: undefined,
      confidence: "95",
      tolerableMisstatement: performanceMateriality,
      expectedMisstatement: "0.00",
      riskOfIncorrectRejection: "10",
      tolerableRate: "5",
      expectedRate: "0",
      topStratumThreshold: "",
      attributePlan: "fixed",
      attributeMode: "statistical",
      strataBounds: undefined,
      sampleSize: "",
      sizeReason: "",
      sizingBasis: "risk-assessment",
      assessedRisk: undefined,
      otherProceduresRisk: undefined,
      confidenceReason: "",
      keyItemThreshold: "",
      keyItems: [],
      selection: "random",
      projection: "ratio",
    },
  };
}

const blank = (v: unknown) => textOf(v).trim() === "";

/**
 * The form's values as the API expects them: percents to fractions, blanks dropped, and only the
 * parameters the chosen method uses (so a stale field of another method cannot fail validation).
 */
export function toRequest(values: PlanFormIn): PlanFormIn {
  const p = { ...values.params } as Record<string, unknown>;
  for (const f of PERCENT_FIELDS) p[f] = blank(p[f]) ? undefined : (percentToFraction(p[f]) ?? p[f]);
  for (const [k, v] of Object.entries(p)) if (blank(v)) delete p[k];
  if (Array.isArray(p.keyItems) && p.keyItems.length === 0) delete p.keyItems;
  const method = p.method;
  const allowed = new Set(planKeysFor(p));
  for (const k of Object.keys(p)) if (!allowed.has(k)) delete p[k];
  const direction = method === "attribute" ? "both" : values.direction;
  return { ...values, direction, params: p as PlanFormIn["params"] };
}

/** The stored parameters of a sample as form values (for editing a plan before the draw). */
export function fromStored(values: PlanFormOut): PlanFormIn {
  const p = values.params;
  return {
    ...values,
    params: {
      ...p,
      confidence: fractionToPercent(p.confidence),
      riskOfIncorrectRejection: fractionToPercent(p.riskOfIncorrectRejection),
      tolerableRate: fractionToPercent(p.tolerableRate),
      expectedRate: fractionToPercent(p.expectedRate),
      topStratumThreshold: p.topStratumThreshold ?? "",
      sampleSize: p.sampleSize ?? "",
      sizeReason: p.sizeReason ?? "",
      sizingBasis: p.sizingBasis ?? "confidence-override",
      confidenceReason:
        p.confidenceReason ?? (p.sizingBasis ? "" : "Planned with a typed confidence before risk-based sizing existed"),
      keyItemThreshold: p.keyItemThreshold ?? "",
      keyItems: p.keyItems ?? [],
      selection: p.selection ?? "random",
      projection: p.projection ?? "ratio",
      attributeMode: p.attributeMode ?? "statistical",
      spreadBasis: p.spreadBasis ?? undefined,
      spreadSampleId: p.spreadSampleId ?? "",
      expectedStdDev: p.expectedStdDev ?? "",
      spreadReason: p.spreadReason ?? "",
    },
  };
}

/** Server field keys ("sampleSize", "params.confidence") as form field names. */
export function formFieldOf(key: string): string {
  if (key.startsWith("params.") || ["populationId", "name", "objective", "assertion", "direction"].includes(key))
    return key;
  if (key === "params" || key === "(body)") return "params.method";
  return `params.${key}`;
}
