// Issue 19's counted nouns, on top of the one formatting module (lib/format/number.ts).
import { formatCount, formatMoney } from "./number";

export { formatCount };

/** "1 item", "2 items", "1,204 items" — never "1 items". `plural` defaults to singular + "s". */
export function countOf(n: number, singular: string, plural = `${singular}s`): string {
  return `${formatCount(n)} ${n === 1 ? singular : plural}`;
}

/** A money amount as the product prints it (lib/format/number.ts formatMoney). */
export const formatAmount = (value: string | number): string => formatMoney(value);
