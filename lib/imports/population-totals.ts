import "server-only";

export interface SignTotal {
  count: number;
  totalCents: bigint;
}

/** Running totals of a population; BigInt because 1M rows × 1e16 cents passes 2^53. */
export interface PopulationTotals {
  rowCount: number;
  totalCents: bigint;
  positive: SignTotal;
  zero: { count: number };
  negative: SignTotal;
}

export function emptyTotals(): PopulationTotals {
  return {
    rowCount: 0,
    totalCents: 0n,
    positive: { count: 0, totalCents: 0n },
    zero: { count: 0 },
    negative: { count: 0, totalCents: 0n },
  };
}

export function addToTotals(totals: PopulationTotals, cents: bigint): void {
  totals.rowCount += 1;
  totals.totalCents += cents;
  if (cents > 0n) {
    totals.positive.count += 1;
    totals.positive.totalCents += cents;
  } else if (cents < 0n) {
    totals.negative.count += 1;
    totals.negative.totalCents += cents;
  } else {
    totals.zero.count += 1;
  }
}
