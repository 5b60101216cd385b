import "server-only";
import { selectPps, selectRandom, selectStratifiedRandom, selectSystematic } from "@/lib/sampling";
import type { SampleMethod } from "@/lib/validation/sample";
import type { Frame } from "./population-frame";
import { stratifyFrame } from "./strata";
import { positionsOfRows, remainderFrame } from "./key-items";

/** Everything a selection depends on besides the frame and the seed; stored with the draw. */
export interface SelectionInputs {
  method: SampleMethod;
  frameSize: number;
  /** Random-number ranks consumed (random and attribute): the original size plus extensions and replacements. */
  ranks?: number;
  sampleSize?: number;
  interval?: number;
  topStratumThreshold?: number;
  strataBounds?: number[];
  /** Ranks consumed per stratum (stratified). */
  stratumRanks?: number[];
  /** Row numbers of the key items (examined 100 %); the rest is drawn from the remainder, in population order. */
  keyRows?: number[];
  /** Nonstatistical plans: how the remainder is selected ("haphazard": picked by the auditor, no seed). */
  selection?: "random" | "systematic" | "haphazard";
}

export interface SelectedItem {
  position: number; // 0-based in the frame (population order)
  order: number; // 1-based selection order
  hitPoints: number[] | null;
  topStratum: boolean;
  stratum: number | null;
  keyItem?: boolean;
}

export const ALGORITHM_VERSION = "1";

const ALGORITHMS: Record<SampleMethod | "haphazard", string> = {
  mus: "MT19937 systematic monetary-unit selection, random start in cents",
  random: "MT19937 random-number sort (n smallest of genrand_res53)",
  attribute: "MT19937 random-number sort (n smallest of genrand_res53)",
  systematic: "MT19937 systematic selection, random start",
  stratified: "MT19937 random-number sort per stratum (seed + stratum number)",
  nonstatistical: "MT19937 random-number sort (n smallest of genrand_res53)",
  haphazard: "Haphazard selection by the auditor (recorded picks; not re-performable from a seed)",
};

export function algorithmName(method: SampleMethod, selection?: SelectionInputs["selection"]): string {
  if (method === "nonstatistical" && selection && selection !== "random") return ALGORITHMS[selection];
  return ALGORITHMS[method];
}

/**
 * The selection for stored inputs and a seed: the same function draws, extends and re-performs.
 * Key items come first (orders 1..K, population order); the method then runs on the remainder
 * frame, its positions mapped back, with orders continuing after the key items.
 */
export function computeSelection(frame: Frame, inputs: SelectionInputs, seed: number): SelectedItem[] {
  const keyRows = inputs.keyRows ?? [];
  if (keyRows.length === 0 && inputs.method !== "nonstatistical") return selectFromFrame(frame, inputs, seed);
  const keyItems: SelectedItem[] = positionsOfRows(frame, keyRows).map((position, i) => ({
    position,
    order: i + 1,
    hitPoints: null,
    topStratum: false,
    stratum: null,
    keyItem: true,
  }));
  const rest = remainderFrame(frame, keyRows);
  const method =
    inputs.method === "nonstatistical" ? (inputs.selection === "systematic" ? "systematic" : "random") : inputs.method;
  const drawn =
    inputs.method === "nonstatistical" && inputs.selection === "haphazard"
      ? []
      : selectFromFrame(rest.frame, { ...inputs, method }, seed);
  return [
    ...keyItems,
    ...drawn.map((it) => ({ ...it, position: rest.positions[it.position], order: it.order + keyItems.length })),
  ];
}

function selectFromFrame(frame: Frame, inputs: SelectionInputs, seed: number): SelectedItem[] {
  switch (inputs.method) {
    case "mus":
      return selectMus(frame, inputs, seed);
    case "systematic":
      return selectSystematic({ populationSize: frame.bookValues.length, sampleSize: inputs.sampleSize!, seed }).map(
        (position, i) => ({ position, order: i + 1, hitPoints: null, topStratum: false, stratum: null }),
      );
    case "stratified":
      return selectStratified(frame, inputs, seed);
    default:
      return selectRandom({ populationSize: frame.bookValues.length, sampleSize: inputs.ranks!, seed }).map(
        (position, i) => ({ position, order: i + 1, hitPoints: null, topStratum: false, stratum: null }),
      );
  }
}

function selectMus(frame: Frame, inputs: SelectionInputs, seed: number): SelectedItem[] {
  const threshold = inputs.topStratumThreshold ?? inputs.interval!;
  const selection = selectPps({ bookValues: frame.bookValues, interval: inputs.interval!, seed });
  const items: SelectedItem[] = selection.hits.map((hit, i) => ({
    position: hit.index,
    order: i + 1,
    hitPoints: hit.hitPoints,
    topStratum: frame.bookValues[hit.index] >= threshold,
    stratum: null,
  }));
  // With a threshold below the interval, top-stratum items the points missed are added: all are examined.
  const hit = new Set(selection.hits.map((h) => h.index));
  frame.bookValues.forEach((v, position) => {
    if (v >= threshold && !hit.has(position))
      items.push({ position, order: items.length + 1, hitPoints: [], topStratum: true, stratum: null });
  });
  return items;
}

function selectStratified(frame: Frame, inputs: SelectionInputs, seed: number): SelectedItem[] {
  const strata = stratifyFrame(frame, inputs.strataBounds!);
  const picks = selectStratifiedRandom({
    strata: strata.map((s, h) => ({ populationSize: s.members.length, sampleSize: inputs.stratumRanks![h] })),
    seed,
  });
  const items: SelectedItem[] = [];
  picks.forEach((indexes, h) =>
    indexes.forEach((k) =>
      items.push({
        position: strata[h].members[k],
        order: items.length + 1,
        hitPoints: null,
        topStratum: false,
        stratum: h + 1,
      }),
    ),
  );
  return items;
}

/** A canonical text of a selection, hashed so two selections can be compared at a glance. */
export function selectionFingerprint(frame: Frame, items: SelectedItem[]): string {
  return items
    .map(
      (it) =>
        `${it.order},${frame.rowNumbers[it.position]},${frame.itemRefs[it.position]},${frame.bookValues[it.position].toFixed(2)},${(it.hitPoints ?? []).map((p) => p.toFixed(2)).join(";")},${it.stratum ?? ""}`,
    )
    .join("\n");
}
