/**
 * The text a form value or stored scalar shows: strings as they are, numbers, booleans and bigints
 * spelt out, null and undefined as "". Anything else (an object) as its JSON, never "[object Object]".
 */
export function textOf(value: unknown): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "string") return value;
  if (typeof value === "number" || typeof value === "boolean" || typeof value === "bigint") return String(value);
  return JSON.stringify(value) ?? "";
}
