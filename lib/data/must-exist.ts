import "server-only";
/**
 * A row the caller already knows is there (the sample it loaded, the summary row it locked). Typed
 * tables make `.first()` return `T | undefined`; a missing row here is a bug, answered 500 and logged.
 */
export function mustExist<T>(row: T, what: string): NonNullable<T> {
  if (row === undefined || row === null) throw new Error(`${what}: expected a row, found none`);
  return row;
}
