import type { SampleItemRecord } from "@/lib/data/sample-items";
import { SaveResultSchema } from "@/lib/validation/sample";
import { itemMisstatement } from "@/lib/samples/item-misstatement";
import type { TestDirection } from "@/lib/sampling";
import type { z } from "zod";

/** One row's result as the grid edits it: plain strings, a yes/no for deviations. */
export interface RowValues {
  status: "not-started" | "done" | "not-auditable";
  auditedValue: string;
  cause: string;
  causeNote: string;
  deviation: "" | "yes" | "no";
  deviationNature: string;
  comment: string;
}

export type SaveBody = z.input<typeof SaveResultSchema>;

export function rowValuesOf(item: SampleItemRecord): RowValues {
  return {
    status: item.status === "void" ? "not-started" : item.status,
    auditedValue: item.auditedValue ?? "",
    cause: item.cause ?? "",
    causeNote: item.causeNote ?? "",
    deviation: item.deviation === null ? "" : item.deviation ? "yes" : "no",
    deviationNature: item.deviationNature ?? "",
    comment: item.comment ?? "",
  };
}

const orNull = (v: string) => (v.trim() === "" ? null : v.trim());

/** The PATCH body for a row: blanks as null, the version the row was read at. */
export function saveBodyOf(v: RowValues, version: number, attribute: boolean): SaveBody {
  return {
    version,
    status: v.status,
    auditedValue: attribute || v.status === "not-auditable" ? null : orNull(v.auditedValue),
    cause: attribute ? null : ((orNull(v.cause) as SaveBody["cause"]) ?? null),
    causeNote: attribute ? null : orNull(v.causeNote),
    deviation: attribute ? (v.deviation === "" ? null : v.deviation === "yes") : null,
    deviationNature: attribute && v.deviation === "yes" ? orNull(v.deviationNature) : null,
    comment: orNull(v.comment),
  };
}

/**
 * Misstatement as the auditor types (book − audited), exact in cents, as the evaluation counts it: an
 * item that could not be audited counts in full in the direction tested (lib/samples/item-misstatement.ts);
 * null while there is no usable audited value.
 */
export function liveMisstatement(
  book: string,
  v: Pick<RowValues, "status" | "auditedValue">,
  direction: TestDirection,
): string | null {
  if (v.status === "not-auditable") return itemMisstatement(v.status, book, null, direction);
  const parsed = SaveResultSchema.shape.auditedValue.safeParse(v.auditedValue);
  if (v.auditedValue.trim() === "" || !parsed.success || parsed.data == null) return null;
  return itemMisstatement("done", book, parsed.data, direction);
}
