import "server-only";
import { selectPps } from "@/lib/sampling";
import type { DrawRecord } from "@/lib/data/samples";

/**
 * The random start of a monetary-unit draw, in currency units: the engine's own selectPps derives it
 * from the seed and the interval alone (its first draw of the generator), so asking it with a one-item
 * frame gives the same start as the draw. Null for methods without a monetary random start.
 */
export function randomStartOf(draw: Pick<DrawRecord, "seed" | "inputs">): number | null {
  if (draw.inputs.method !== "mus" || !draw.inputs.interval) return null;
  return selectPps({ bookValues: [0.01], interval: draw.inputs.interval, seed: draw.seed }).randomStart;
}
