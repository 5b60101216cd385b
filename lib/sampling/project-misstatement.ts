/**
 * Projection of the misstatement found in a nonstatistical sample to the untested remainder.
 */
import { EngineInputError } from "./errors";
import { addCents, fromCents, toCents } from "./money";
import { sampleToCents } from "./sample-input";
import type { SampledItem } from "./types";
import { requireInteger, requireObject, requireOneOf } from "./validate";

export const PROJECTION_METHODS = ["ratio", "difference"] as const;
export type ProjectionMethod = (typeof PROJECTION_METHODS)[number];

export interface ProjectedMisstatement {
  /** The sample's misstatement projected to the remainder (overstatement positive). */
  projectedMisstatement: number;
  /** Key items' misstatement, at its actual amount. */
  keyItemsMisstatement: number;
  /** Projection plus key items. */
  total: number;
  /** Σ (book − audited) over the sample. */
  sampleMisstatement: number;
  sampleBookValue: number;
  /** Misstatement ÷ sampled book (ratio) or misstatement per item (difference). */
  rate: number;
}

/**
 * Projected misstatement of a nonstatistical sample (PCAOB AS 2315.26; AICPA Audit Guide "Audit
 * Sampling", nonstatistical chapter):
 * - ratio: Σ misstatement ÷ Σ sampled book value × remainder book value;
 * - difference: Σ misstatement ÷ n × remainder item count (AS 2315.26: $3,000 in 50 of 1,000 items → $60,000).
 * Key items (examined 100 %) are added at their actual misstatement, with no projection. Misstatement
 * is book − audited (overstatement positive); sums are exact in cents.
 *
 * @throws {TypeError} when a field has the wrong type.
 * @throws {EngineInputError} when the sample is empty, the ratio method's sampled book value is zero, or a
 *   count or amount is out of range.
 * @example
 * projectMisstatement({ method: "difference", sample: fiftyItemsWith3000Over, remainderBookValue: 500000, remainderItemCount: 1000 })
 * // → { projectedMisstatement: 60000, keyItemsMisstatement: 0, total: 60000, … }
 */
export function projectMisstatement(o: {
  method: ProjectionMethod;
  sample: SampledItem[];
  remainderBookValue: number;
  remainderItemCount: number;
  keyItems?: SampledItem[];
}): ProjectedMisstatement {
  requireObject("options", o);
  const method = requireOneOf("method", o.method, PROJECTION_METHODS);
  const s = sampleToCents("sample", o.sample, 1);
  const key = sampleToCents("keyItems", o.keyItems ?? [], 0);
  const remainderCents = toCents("remainderBookValue", o.remainderBookValue);
  const remainderCount = requireInteger(
    "remainderItemCount",
    o.remainderItemCount,
    s.book.length,
    Number.MAX_SAFE_INTEGER,
  );
  let missCents = 0,
    bookCents = 0,
    keyCents = 0;
  for (let i = 0; i < s.book.length; i++) {
    missCents = addCents("sample misstatement", missCents, s.book[i]! - s.audited[i]!);
    bookCents = addCents("sample book value", bookCents, s.book[i]!);
  }
  for (let i = 0; i < key.book.length; i++)
    keyCents = addCents("keyItems misstatement", keyCents, key.book[i]! - key.audited[i]!);
  let projectedCents: number, rate: number;
  if (method === "ratio") {
    if (bookCents === 0)
      throw new EngineInputError(
        "sample",
        "sample: the sampled book value is zero, so the ratio method cannot project; use the difference method",
      );
    rate = missCents / bookCents;
    projectedCents = divideRounded(BigInt(missCents) * BigInt(remainderCents), BigInt(bookCents));
  } else {
    rate = missCents / s.book.length / 100;
    projectedCents = divideRounded(BigInt(missCents) * BigInt(remainderCount), BigInt(s.book.length));
  }
  return {
    projectedMisstatement: fromCents(projectedCents),
    keyItemsMisstatement: fromCents(keyCents),
    total: fromCents(addCents("total", projectedCents, keyCents)),
    sampleMisstatement: fromCents(missCents),
    sampleBookValue: fromCents(bookCents),
    rate,
  };
}

/** a ÷ b rounded half away from zero, as a safe integer (exact for any product of cents). */
function divideRounded(a: bigint, b: bigint): number {
  const negative = a < 0n !== b < 0n;
  const absA = a < 0n ? -a : a,
    absB = b < 0n ? -b : b;
  const q = (2n * absA + absB) / (2n * absB);
  const result = Number(negative ? -q : q);
  if (!Number.isSafeInteger(result))
    throw new EngineInputError("remainderBookValue", "projectedMisstatement exceeds the exact range in cents");
  return result;
}
