import "server-only";
import { CAUSE_LABELS, MISSTATEMENT_CAUSES, SaveResultSchema, type SaveResult } from "@/lib/validation/sample";
import { readAmount, readChoice, readRef, readText, readWhole, readYesNo, type Read } from "./cell-values";
import {
  causeFromText,
  resultFingerprint,
  STATUS_LABELS,
  statusFromText,
  type ColumnKey,
  type RowResult,
  type WorkbookKind,
} from "./workbook-layout";
import type { WorkbookProblem } from "./workbook-problems";
import type { ItemsSheet, SheetRow } from "./workbook-read";
import { formatDateTime } from "@/lib/format/date";

/** What the import needs to know of each item of the current draw. */
export interface ItemFacts {
  id: number;
  itemRef: string;
  bookValue: string;
  status: "not-started" | "done" | "not-auditable" | "void";
  version: number;
  updatedByName: string | null;
  updatedAt: string | null;
  result: RowResult;
}

export interface RowChange {
  row: number;
  itemId: number;
  input: SaveResult;
}
export interface ImportPlan {
  changes: RowChange[];
  unchanged: number;
  problems: WorkbookProblem[];
}

const SCHEMA_FIELD_TO_COLUMN: Record<string, ColumnKey> = {
  auditedValue: "auditedValue",
  status: "status",
  cause: "cause",
  causeNote: "causeNote",
  deviation: "deviation",
  deviationNature: "deviationNature",
  comment: "comment",
};

function parseResult(
  kind: WorkbookKind,
  sr: SheetRow,
  current: RowResult,
  report: (key: ColumnKey, reason: string) => void,
): RowResult | null {
  let bad = false;
  const take = <T>(key: ColumnKey, read: Read<T>, fallback: T): T => {
    if (read.ok) return read.value;
    report(key, read.reason);
    bad = true;
    return fallback;
  };
  const c = sr.cells;
  const r: RowResult = { ...current };
  const status = take("status", readChoice(c.status, statusFromText, Object.values(STATUS_LABELS)), null);
  r.comment = take("comment", readText(c.comment, 4000), null);
  if (kind === "amounts") {
    r.auditedValue = take("auditedValue", readAmount(c.auditedValue), null);
    r.cause = take(
      "cause",
      readChoice(
        c.cause,
        causeFromText,
        MISSTATEMENT_CAUSES.map((k) => CAUSE_LABELS[k]),
      ),
      null,
    );
    r.causeNote = take("causeNote", readText(c.causeNote, 2000), null);
  } else {
    r.deviation = take("deviation", readYesNo(c.deviation), null);
    r.deviationNature = take("deviationNature", readText(c.deviationNature, 2000), null);
  }
  if (bad) return null;
  const answered = kind === "amounts" ? r.auditedValue !== null : r.deviation !== null;
  r.status = status ?? (answered ? "done" : "not-started");
  const resultKey: ColumnKey = kind === "amounts" ? "auditedValue" : "deviation";
  if (r.status === "not-started" && answered)
    report(
      "status",
      `Status is ${STATUS_LABELS["not-started"]} but a result is entered: set Status to ${STATUS_LABELS.done}, or clear the result.`,
    );
  else if (r.status === "done" && !answered)
    report(
      resultKey,
      kind === "amounts"
        ? "Done without an audited value: enter the audited value, or change the status."
        : "Done without a deviation answer: enter Yes or No, or change the status.",
    );
  else if (r.status === "not-auditable" && kind === "amounts" && r.auditedValue !== null)
    report(
      "auditedValue",
      `${STATUS_LABELS["not-auditable"]} with an audited value: clear the value, or set Status to ${STATUS_LABELS.done}.`,
    );
  else return r;
  return null;
}

function staleReason(item: ItemFacts, version: number): string {
  const when = item.updatedAt ? `on ${formatDateTime(item.updatedAt)}` : "recently";
  return `Version conflict: ${item.updatedByName ?? "Someone"} changed this item ${when}, after this workbook was exported (workbook version ${version}, now ${item.version}). Your change to this row was not applied: export a fresh workbook and enter it again.`;
}

/**
 * Checks every row of the sheet against the items of the current draw and decides what to write:
 * rows whose values still match the export are left alone; every problem is collected, none thrown.
 */
export function planWorkbookImport(kind: WorkbookKind, sheet: ItemsSheet, items: ItemFacts[]): ImportPlan {
  const byId = new Map(items.map((i) => [i.id, i]));
  const byRef = new Map<string, ItemFacts[]>();
  for (const i of items) byRef.set(i.itemRef, [...(byRef.get(i.itemRef) ?? []), i]);
  const seen = new Map<number, number>();
  const plan: ImportPlan = { changes: [], unchanged: 0, problems: [] };
  for (const sr of sheet.rows) {
    const before = plan.problems.length;
    const report = (key: ColumnKey, reason: string) => {
      const place = sheet.columns[key];
      plan.problems.push({
        row: sr.row,
        column: place?.header ?? key,
        cell: place ? `${place.letter}${sr.row}` : undefined,
        reason,
      });
    };
    const ref = readRef(sr.cells.itemRef);
    const itemId = readWhole(sr.cells.itemId);
    const version = readWhole(sr.cells.version);
    if (ref === null) {
      report("itemRef", "The item reference is empty.");
      continue;
    }
    const candidates = byRef.get(ref) ?? [];
    if (candidates.length === 0) {
      report("itemRef", `Unknown reference: no item "${ref}" in this sample's current selection.`);
      continue;
    }
    const item = itemId !== null ? byId.get(itemId) : candidates.length === 1 ? candidates[0] : undefined;
    if (!item || item.itemRef !== ref) {
      report(
        "itemRef",
        `The hidden item id does not match the reference "${ref}" (rows moved, pasted or typed in?): export a fresh workbook.`,
      );
      continue;
    }
    if (version === null) {
      report("version", "The hidden Version column is empty or changed: export a fresh workbook.");
      continue;
    }
    const firstRow = seen.get(item.id);
    if (firstRow !== undefined) {
      report("itemRef", `Item "${ref}" appears twice (first at row ${firstRow}).`);
      continue;
    }
    seen.set(item.id, sr.row);
    if (item.status === "void") {
      report("itemRef", `Item "${ref}" was voided and replaced; record the result on its replacement.`);
      continue;
    }
    const book = readAmount(sr.cells.bookValue);
    if (!book.ok || book.value !== item.bookValue)
      report("bookValue", `The book value was changed; it is fixed by the selection at ${item.bookValue}.`);
    const result = parseResult(kind, sr, item.result, report);
    if (!result || plan.problems.length > before) continue;
    const exported = sr.cells.exported.kind === "text" ? sr.cells.exported.value : null;
    const fingerprint = resultFingerprint(kind, result);
    if (fingerprint === exported || fingerprint === resultFingerprint(kind, item.result)) {
      plan.unchanged++;
      continue;
    }
    if (version !== item.version) {
      report("itemRef", staleReason(item, version));
      continue;
    }
    const parsed = SaveResultSchema.safeParse({ version, ...result });
    if (!parsed.success) {
      for (const issue of parsed.error.issues)
        report(SCHEMA_FIELD_TO_COLUMN[String(issue.path[0])] ?? "status", issue.message);
      continue;
    }
    plan.changes.push({ row: sr.row, itemId: item.id, input: parsed.data });
  }
  return plan;
}
