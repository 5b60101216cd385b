import "server-only";

/** Largest upload accepted, in bytes (200 MB). */
export const MAX_UPLOAD_BYTES = 200 * 1024 * 1024;
/** Most data rows (header excluded) accepted in one population. */
export const MAX_DATA_ROWS = 1_000_000;
/** Most columns a ledger may have (a real one has a few dozen; the mapping screen lists them all). */
export const MAX_COLUMNS = 500;
/** Bytes examined to tell the file kind and encoding. */
export const SNIFF_BYTES = 64 * 1024;
/** Bytes read for the column-mapping preview of a CSV. */
export const PREVIEW_BYTES = 256 * 1024;
/** Data rows shown in the preview. */
export const PREVIEW_ROWS = 20;
/** Problems kept with full detail; later ones are only counted. */
export const MAX_PROBLEM_DETAILS = 10_000;

export interface ImportLimits {
  maxBytes: number;
  maxRows: number;
  maxProblemDetails: number;
}

export const DEFAULT_LIMITS: ImportLimits = {
  maxBytes: MAX_UPLOAD_BYTES,
  maxRows: MAX_DATA_ROWS,
  maxProblemDetails: MAX_PROBLEM_DETAILS,
};

export function resolveLimits(overrides?: Partial<ImportLimits>): ImportLimits {
  return { ...DEFAULT_LIMITS, ...overrides };
}
