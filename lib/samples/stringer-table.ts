import "server-only";
import { poissonFactor, type BoundSide, type FactorMode } from "@/lib/sampling";

export interface StringerRow {
  rank: number;
  tainting: number;
  factor: number;
  factorIncrement: number;
  projection: number;
  incrementalAllowance: number;
}

/**
 * The Stringer bound laid out line by line for the reviewer: each ranked tainting with its factor
 * RF(k), the increment RF(k) − RF(k−1) − 1, its projection t·J and its incremental allowance. The
 * totals are the engine's; these rows only show how they add up.
 */
export function stringerRows(side: BoundSide, interval: number, confidence: number, mode: FactorMode): StringerRow[] {
  let previous = poissonFactor(0, confidence, mode);
  return side.taintings.map((t, i) => {
    const factor = poissonFactor(i + 1, confidence, mode);
    const increment = factor - previous - 1;
    previous = factor;
    return { rank: i + 1, tainting: t, factor, factorIncrement: increment, projection: t * interval, incrementalAllowance: increment * t * interval };
  });
}
