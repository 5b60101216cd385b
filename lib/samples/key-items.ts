import "server-only";
import { centsToDecimal } from "@/lib/money";
import { fieldError } from "@/lib/errors";
import type { SampleParams } from "@/lib/validation/sample";
import type { Frame } from "./population-frame";

/** A key item as the plan records it: examined 100 %, kept apart from the sample. */
export interface PlannedKeyItem {
  rowNumber: number;
  itemRef: string;
  bookValue: string;
  basis: "threshold" | "chosen";
  reason: string | null;
}

export interface KeyItemsPlan {
  threshold: string | null;
  items: PlannedKeyItem[];
  count: number;
  total: string;
  /** The items the sample is sized and drawn on: the frame less the key items. */
  remainder: { count: number; total: string };
}

/**
 * The key items of a plan (one mechanism for nonstatistical and classical plans): every item at or
 * above the threshold, and the items the auditor names, each with a reason. Null when the plan has none.
 */
export function resolveKeyItems(frame: Frame, params: SampleParams): KeyItemsPlan | null {
  const threshold = params.keyItemThreshold === undefined ? null : Number(params.keyItemThreshold);
  const chosen = params.keyItems ?? [];
  if (threshold === null && chosen.length === 0) return null;
  if (threshold !== null && threshold <= 0)
    throw fieldError("keyItemThreshold", "The key-item threshold must be above zero");
  const byRef = new Map<string, number[]>();
  if (chosen.length > 0)
    frame.itemRefs.forEach((ref, i) => {
      const list = byRef.get(ref);
      if (list) list.push(i);
      else byRef.set(ref, [i]);
    });
  const picked = new Map<number, PlannedKeyItem>();
  const entry = (i: number, basis: PlannedKeyItem["basis"], reason: string | null): PlannedKeyItem => ({
    rowNumber: frame.rowNumbers[i],
    itemRef: frame.itemRefs[i],
    bookValue: centsToDecimal(frame.bookCents[i]),
    basis,
    reason,
  });
  if (threshold !== null)
    frame.bookValues.forEach((v, i) => {
      if (v >= threshold) picked.set(i, entry(i, "threshold", null));
    });
  chosen.forEach((k, n) => {
    const positions = byRef.get(k.itemRef);
    if (!positions) throw fieldError(`keyItems.${n}.itemRef`, `No item ${k.itemRef} in this population`);
    if (positions.length > 1)
      throw fieldError(
        `keyItems.${n}.itemRef`,
        `${positions.length} items carry the reference ${k.itemRef}; the population must identify it uniquely`,
      );
    const i = positions[0];
    picked.set(i, { ...entry(i, picked.has(i) ? "threshold" : "chosen", k.reason) });
  });
  const positions = [...picked.keys()].sort((a, b) => a - b);
  let cents = 0n;
  for (const i of positions) cents += frame.bookCents[i];
  if (positions.length >= frame.bookValues.length)
    throw fieldError(
      threshold !== null ? "keyItemThreshold" : "keyItems",
      "Every item would be a key item: nothing is left to sample (examine the population in full instead)",
    );
  return {
    threshold: threshold === null ? null : threshold.toFixed(2),
    items: positions.map((i) => picked.get(i)!),
    count: positions.length,
    total: centsToDecimal(cents),
    remainder: { count: frame.bookValues.length - positions.length, total: centsToDecimal(frame.totalCents - cents) },
  };
}

/** The frame without the key items, with the map from its positions back to the full frame's. */
export function remainderFrame(frame: Frame, keyRows: readonly number[]): { frame: Frame; positions: number[] } {
  if (keyRows.length === 0) return { frame, positions: Array.from(frame.bookValues, (_, i) => i) };
  const key = new Set(keyRows);
  const positions: number[] = [];
  frame.rowNumbers.forEach((row, i) => {
    if (!key.has(row)) positions.push(i);
  });
  const sub: Frame = {
    populationId: frame.populationId,
    rowNumbers: Int32Array.from(positions, (i) => frame.rowNumbers[i]),
    itemRefs: positions.map((i) => frame.itemRefs[i]),
    bookValues: positions.map((i) => frame.bookValues[i]),
    bookCents: positions.map((i) => frame.bookCents[i]),
    totalCents: 0n,
  };
  sub.totalCents = sub.bookCents.reduce((a, b) => a + b, 0n);
  return { frame: sub, positions };
}

/** Positions in the frame of the given row numbers, in population order. */
export function positionsOfRows(frame: Frame, rows: readonly number[]): number[] {
  const wanted = new Set(rows);
  const out: number[] = [];
  frame.rowNumbers.forEach((row, i) => {
    if (wanted.has(row)) out.push(i);
  });
  return out;
}
