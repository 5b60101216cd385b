/**
 * Input validation shared by every engine function. One policy: a value of the wrong type throws a
 * `TypeError` (the caller's validation should have caught it: a programming error), a value of the
 * right type outside its allowed range throws an `EngineInputError` (a `RangeError` carrying the
 * field); both messages start with the field's name so a caller can show it next to the input.
 */
import { EngineInputError } from "./errors";

function describe(value: unknown): string {
  if (typeof value === "number") return String(value);
  if (typeof value === "string") return JSON.stringify(value);
  if (value === null) return "null";
  if (Array.isArray(value)) return "an array";
  return typeof value;
}

/** Throws a TypeError unless `value` is a finite number. */
export function requireFiniteNumber(field: string, value: unknown): number {
  if (typeof value !== "number" || Number.isNaN(value)) {
    throw new TypeError(`${field} must be a number (got ${describe(value)})`);
  }
  if (!Number.isFinite(value)) throw new EngineInputError(field, `${field} must be finite (got ${value})`);
  return value;
}

/** Throws unless `value` is an integer in [min, max]. */
export function requireInteger(field: string, value: unknown, min: number, max: number): number {
  const v = requireFiniteNumber(field, value);
  if (!Number.isInteger(v) || v < min || v > max) {
    throw new EngineInputError(field, `${field} must be an integer between ${min} and ${max} (got ${v})`);
  }
  return v;
}

/** Throws unless `value` is a number strictly between 0 and 1 (rates, confidences, risks). */
export function requireOpenFraction(field: string, value: unknown): number {
  const v = requireFiniteNumber(field, value);
  if (!(v > 0 && v < 1)) throw new EngineInputError(field, `${field} must be strictly between 0 and 1 (got ${v})`);
  return v;
}

/** Throws unless `value` is a number > 0 (or >= 0 when `allowZero`). */
export function requirePositive(field: string, value: unknown, allowZero = false): number {
  const v = requireFiniteNumber(field, value);
  if (allowZero ? v < 0 : v <= 0) {
    throw new EngineInputError(
      field,
      `${field} must be ${allowZero ? "zero or greater" : "greater than zero"} (got ${v})`,
    );
  }
  return v;
}

/** Throws a TypeError unless `value` is an array. */
export function requireArray<T>(field: string, value: unknown): T[] {
  if (!Array.isArray(value)) throw new TypeError(`${field} must be an array (got ${describe(value)})`);
  return value as T[];
}

/** Throws a TypeError unless `value` is a non-null object. */
export function requireObject(field: string, value: unknown): Record<string, unknown> {
  if (typeof value !== "object" || value === null || Array.isArray(value)) {
    throw new TypeError(`${field} must be an object (got ${describe(value)})`);
  }
  return value as Record<string, unknown>;
}

/** Throws a RangeError unless `value` is one of `options`. */
export function requireOneOf<T extends string>(field: string, value: unknown, options: readonly T[]): T {
  if (typeof value !== "string" || !(options as readonly string[]).includes(value)) {
    throw new EngineInputError(
      field,
      `${field} must be one of ${options.map((o) => `"${o}"`).join(", ")} (got ${describe(value)})`,
    );
  }
  return value as T;
}

/** Seeds are integers 0..2^32-1, the domain of MT19937's init_genrand. */
export function requireSeed(field: string, value: unknown): number {
  return requireInteger(field, value, 0, 4294967295);
}
