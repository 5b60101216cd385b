import type { SampleRecord } from "@/lib/data/samples";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import { DIRECTION_LABELS, ESTIMATOR_LABELS, METHOD_LABELS, type SampleMethod } from "@/lib/validation/sample";
import { textOf } from "@/lib/format/text";
import { ITEM_STATUS_LABELS as SHARED_ITEM_STATUS_LABELS } from "@/lib/fieldwork/field-labels";

export { DIRECTION_LABELS, ESTIMATOR_LABELS, METHOD_LABELS };

/** Short names for lists, where the full method label is too long. */
export const METHOD_SHORT: Record<SampleMethod, string> = {
  mus: "Monetary-unit (PPS)",
  random: "Simple random",
  systematic: "Systematic",
  stratified: "Stratified random",
  attribute: "Attribute",
  nonstatistical: "Nonstatistical",
};

export const SAMPLE_STATUS_LABELS: Record<SampleRecord["status"], string> = {
  planned: "Planned, not drawn",
  drawn: "Drawn",
};

export const ITEM_STATUS_LABELS: Record<SampleItemRecord["status"], string> = SHARED_ITEM_STATUS_LABELS;

/** Methods whose items may be replaced one by one, and those that may be extended (lib/samples/extend.ts). */
export const REPLACEABLE: SampleMethod[] = ["random", "attribute", "stratified"];
export const EXTENDABLE: SampleMethod[] = ["random", "attribute"];

/** "95" → 0.95, exact to 12 significant figures (no 0.07 * 100 = 7.000000000000001 surprises); null when not a number. */
export function percentToFraction(text: unknown): number | null {
  const s = textOf(text).trim().replace(/%$/, "").trim();
  if (s === "" || !/^-?\d*\.?\d+$/.test(s)) return null;
  return Number((Number(s) / 100).toPrecision(12));
}

export function fractionToPercent(fraction: number | undefined): string {
  return fraction === undefined ? "" : String(Number((fraction * 100).toPrecision(12)));
}
