import "server-only";
import { formatCount } from "@/lib/format/number";
import type { Knex } from "knex";
import { planningSpread, type Estimator, type PlanningSpread } from "@/lib/sampling";
import { standardDeviation } from "@/lib/sampling/descriptive";
import { getSampleById, listDrawsBySampleId } from "@/lib/data/samples";
import { listItemsByDrawId } from "@/lib/data/sample-items";
import { AppError, fieldError } from "@/lib/errors";
import type { SampleParams } from "@/lib/validation/sample";
import type { Frame } from "./population-frame";

/** An earlier sample's spread for the plan's estimator, named for the workpaper. */
export interface PriorSpread extends PlanningSpread {
  sampleId: number;
  sampleName: string;
}

/** The planned spread and where it came from, printed with the size. */
export interface SpreadChoice {
  basis: "book-values" | "prior-sample" | "entered";
  value: number;
  symbol: string;
  /** One line for the size panel and the workpaper: basis, figure, source. */
  detail: string;
  warnings: string[];
}

const SYMBOL_MEANING: Record<PlanningSpread["symbol"], string> = {
  s_y: "standard deviation of audited values",
  s_d: "standard deviation of the differences (audited − book)",
  s_e: "standard deviation of the residuals",
};

/**
 * The spread of an earlier sample of the same engagement, for the estimator being planned:
 * s_d for difference, s_e for ratio and regression, s_y for mean-per-unit (Cochran 1977 ch. 6–7).
 */
export async function loadPriorSpread(
  db: Knex,
  { engagementId, sampleId, estimator }: { engagementId: number; sampleId: number; estimator: Estimator },
): Promise<PriorSpread> {
  const prior = await getSampleById(db, { engagementId, sampleId }).catch((err: unknown) => {
    if (err instanceof AppError && err.status === 404)
      throw fieldError("spreadSampleId", "no such sample on this engagement");
    throw err;
  });
  if (prior.method === "attribute")
    throw fieldError("spreadSampleId", `“${prior.name}” is a test of controls: it has no audited values`);
  const current = (await listDrawsBySampleId(db, { sampleId })).find((d) => d.current);
  if (!current) throw fieldError("spreadSampleId", `“${prior.name}” has not been drawn yet`);
  const { items } = await listItemsByDrawId(db, { drawId: current.id });
  const done = items
    .filter((i) => i.status === "done" && i.auditedValue !== null)
    .map((i) => ({ bookValue: Number(i.bookValue), auditedValue: Number(i.auditedValue) }));
  try {
    return { ...planningSpread({ estimator, sample: done }), sampleId, sampleName: prior.name };
  } catch (err) {
    if (err instanceof RangeError) throw fieldError("spreadSampleId", `“${prior.name}”: ${err.message}`);
    throw err;
  }
}

/** The standard deviation a random or systematic plan is sized with, its basis, and the warnings it calls for. */
export function resolveSpread(frame: Frame, p: SampleParams, prior?: PriorSpread): SpreadChoice {
  const estimator = (p.estimator ?? "mean-per-unit") as Estimator;
  if (p.spreadBasis === "prior-sample") {
    if (!prior) throw fieldError("spreadSampleId", "choose the earlier sample whose results give the spread");
    if (!(prior.standardDeviation > 0))
      throw fieldError(
        "spreadSampleId",
        `“${prior.sampleName}” shows no spread (${prior.symbol} = 0): enter an expected standard deviation with a reason`,
      );
    return {
      basis: "prior-sample",
      value: prior.standardDeviation,
      symbol: prior.symbol,
      warnings: [],
      detail: `${prior.symbol} = ${prior.standardDeviation.toFixed(2)}, the ${SYMBOL_MEANING[prior.symbol]} of ${prior.items} results in the earlier sample “${prior.sampleName}” of this engagement.`,
    };
  }
  if (p.spreadBasis === "entered") {
    const value = Number(p.expectedStdDev);
    return {
      basis: "entered",
      value,
      symbol: "S",
      warnings: [],
      detail: `S = ${value.toFixed(2)}, entered by the planner: ${p.spreadReason ?? ""}`,
    };
  }
  const value = standardDeviation(frame.bookValues);
  const given = p.spreadBasis === "book-values";
  const warnings =
    estimator !== "mean-per-unit" && !given
      ? [
          `No planning spread was given for the ${estimator} estimator: the size is the mean-per-unit size, from the book values' spread. The ${estimator} estimator's precision depends on the spread of the ${estimator === "difference" ? "differences" : "residuals"} (Cochran 1977 ch. 6–7): give an earlier sample or an expected figure to size for it.`,
        ]
      : [];
  return {
    basis: "book-values",
    value,
    symbol: "S",
    warnings,
    detail: `S = ${value.toFixed(2)}, the standard deviation of the population's ${formatCount(frame.bookValues.length)} book values${estimator === "mean-per-unit" ? "" : given ? " (chosen by the planner for this estimator)" : " (default)"}.`,
  };
}
