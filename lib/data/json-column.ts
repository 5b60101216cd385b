import "server-only";
import type { z } from "zod";

/**
 * A JSON column read back: parsed from its text, then checked with the zod schema of what was
 * written. A stored value that no longer fits is a bug, answered 500 and logged, naming the column.
 */
export function parseJsonColumn<S extends z.ZodType>(schema: S, value: unknown, column: string): z.output<S> {
  const data: unknown = typeof value === "string" ? JSON.parse(value) : value;
  const parsed = schema.safeParse(data);
  if (!parsed.success) {
    throw new Error(
      `${column}: the stored JSON does not fit its schema (${parsed.error.issues.map((i) => `${i.path.join(".") || "(root)"}: ${i.message}`).join("; ")})`,
    );
  }
  return parsed.data;
}
