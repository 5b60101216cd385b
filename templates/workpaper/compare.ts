/** Exact comparisons of decimal strings for the evaluation's "against tolerable" lines. */
import { centsToDecimal, decimalToCents } from "@/lib/money";
import type { Money } from "./workpaper-data";

export function compareMoney(a: Money, b: Money): -1 | 0 | 1 {
  const d = decimalToCents(a) - decimalToCents(b);
  return d < 0n ? -1 : d > 0n ? 1 : 0;
}

export function subtractMoney(a: Money, b: Money): Money {
  return centsToDecimal(decimalToCents(a) - decimalToCents(b));
}

export function absMoney(a: Money): Money {
  const c = decimalToCents(a);
  return centsToDecimal(c < 0n ? -c : c);
}

/** "below" / "equal to" / "above", for a sentence. */
export function relation(a: Money, b: Money): string {
  const c = compareMoney(a, b);
  return c < 0 ? "below" : c === 0 ? "equal to" : "above";
}
