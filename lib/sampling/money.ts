/**
 * Exact money: amounts cross the engine's surface in currency units with at most 2 decimals and are
 * summed inside as integer cents, so no total depends on the order of floating-point additions.
 */
import { requireFiniteNumber } from "./validate";
import { EngineInputError } from "./errors";

/**
 * Converts an amount in currency units to integer cents (Math.round(x * 100)).
 *
 * The amount must have at most 2 decimals: a scaled value further than a few ulps from an integer
 * (e.g. 12.345) is rejected rather than silently rounded.
 *
 * @throws {TypeError} when `value` is not a number.
 * @throws {RangeError} when it is not finite, has more than 2 decimals, or exceeds the safe-integer range in cents.
 * @example toCents("bookValue", 1234.56) // → 123456
 */
export function toCents(field: string, value: unknown): number {
  const v = requireFiniteNumber(field, value);
  const scaled = v * 100;
  const cents = Math.round(scaled);
  if (!Number.isSafeInteger(cents)) {
    throw new EngineInputError(field, `${field} is too large to hold exactly in cents (got ${v})`);
  }
  const tolerance = Math.max(1e-6, Math.abs(scaled) * 4 * Number.EPSILON);
  if (Math.abs(scaled - cents) > tolerance) {
    throw new EngineInputError(field, `${field} must have at most 2 decimals (got ${v})`);
  }
  return cents;
}

/** Adds two integer-cent amounts, checking that the total stays exact. */
export function addCents(field: string, total: number, cents: number): number {
  const next = total + cents;
  if (!Number.isSafeInteger(next)) throw new EngineInputError(field, `${field} total exceeds the exact range in cents`);
  return next;
}

/** Converts integer cents back to currency units. @example fromCents(123456) // → 1234.56 */
export function fromCents(cents: number): number {
  return cents / 100;
}

/**
 * Fast path of `toCents` for tight loops over large arrays: plain arithmetic for the common case
 * (a finite number within 1e-6 cent of a whole cent), falling back to `toCents` — which accepts the
 * same values and throws the same errors — for anything else. `fieldOf` builds the field name only
 * when the slow path is taken.
 */
export function toCentsFast(value: unknown, fieldOf: (index: number) => string, index: number): number {
  if (typeof value === "number") {
    const scaled = value * 100;
    const cents = Math.round(scaled);
    const diff = scaled - cents;
    if (diff <= 1e-6 && diff >= -1e-6 && cents <= Number.MAX_SAFE_INTEGER && cents >= -Number.MAX_SAFE_INTEGER)
      return cents;
  }
  return toCents(fieldOf(index), value);
}
