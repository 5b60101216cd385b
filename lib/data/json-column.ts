import "server-only";
import type { z } from "zod";

/**
 * A JSON column read back: parsed from its text, then checked with the zod schema of what was
 * written. A stored value that no longer fits (or is not JSON) is a bug, answered 500 and logged,
 * naming the column ("table.column") and, when given, the row's id.
 */
export function parseJsonColumn<S extends z.ZodType>(
  schema: S,
  value: unknown,
  column: string,
  rowId?: number | string,
): z.output<S> {
  const where = rowId === undefined ? column : `${column} of row ${rowId}`;
  let data: unknown = value;
  if (typeof value === "string") {
    try {
      data = JSON.parse(value);
    } catch (err) {
      throw new Error(`${where}: the stored text is not JSON (${err instanceof Error ? err.message : String(err)})`);
    }
  }
  const parsed = schema.safeParse(data);
  if (!parsed.success) {
    throw new Error(
      `${where}: the stored JSON does not fit its schema (${parsed.error.issues.map((i) => `${i.path.join(".") || "(root)"}: ${i.message}`).join("; ")})`,
    );
  }
  return parsed.data;
}
