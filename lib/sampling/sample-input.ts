/**
 * Validation of sampled items: every book and audited value becomes integer cents, and every
 * message names the item (`sample[3].auditedValue`).
 */
import { toCents } from "./money";
import type { SampledItem } from "./types";
import { requireArray, requireObject } from "./validate";
import { EngineInputError } from "./errors";

export interface CentsSample {
  book: Float64Array;
  audited: Float64Array;
}

/** Converts a sample to integer-cent arrays, checking its length is within [minSize, maxSize]. */
export function sampleToCents(field: string, value: unknown, minSize: number, maxSize = Infinity): CentsSample {
  const sample = requireArray<SampledItem>(field, value);
  if (sample.length < minSize || sample.length > maxSize) {
    const upper = Number.isFinite(maxSize) ? ` and at most ${maxSize}` : "";
    throw new EngineInputError(field, `${field} must hold at least ${minSize}${upper} items (got ${sample.length})`);
  }
  const book = new Float64Array(sample.length);
  const audited = new Float64Array(sample.length);
  for (let i = 0; i < sample.length; i++) {
    const item = requireObject(`${field}[${i}]`, sample[i]);
    book[i] = toCents(`${field}[${i}].bookValue`, item.bookValue);
    audited[i] = toCents(`${field}[${i}].auditedValue`, item.auditedValue);
  }
  return { book, audited };
}
