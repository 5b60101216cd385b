import "server-only";
import { createHash } from "node:crypto";
import { CAUSE_LABELS, ITEM_STATUSES, MISSTATEMENT_CAUSES } from "@/lib/validation/sample";
import type { SampleMethod } from "@/lib/validation/sample";
import { ITEM_STATUS_ALIASES, ITEM_STATUS_LABELS } from "./field-labels";

/** The fieldwork workbook's two layouts: amounts for variables and MUS samples, yes/no deviations for attribute samples. */
export type WorkbookKind = "amounts" | "deviations";

export type ColumnKey =
  | "order"
  | "itemRef"
  | "description"
  | "bookValue"
  | "selectedAs"
  | "auditedValue"
  | "status"
  | "cause"
  | "causeNote"
  | "deviation"
  | "deviationNature"
  | "comment"
  | "misstatement"
  | "itemId"
  | "version"
  | "exported";

export interface ColumnSpec {
  key: ColumnKey;
  header: string;
  width: number;
  /** Unlocked for the person filling the sheet. */
  fill?: boolean;
  hidden?: boolean;
}

export const ITEMS_SHEET = "Items";
export const COVER_SHEET = "Cover";

const lead: ColumnSpec[] = [
  { key: "order", header: "Order", width: 8 },
  { key: "itemRef", header: "Item reference", width: 20 },
  { key: "description", header: "Description", width: 36 },
  { key: "bookValue", header: "Book value", width: 16 },
  { key: "selectedAs", header: "Selected as", width: 28 },
];
const hiddenTail: ColumnSpec[] = [
  { key: "itemId", header: "Item id", width: 10, hidden: true },
  { key: "version", header: "Version", width: 10, hidden: true },
  { key: "exported", header: "Exported values", width: 20, hidden: true },
];

const LAYOUTS: Record<WorkbookKind, ColumnSpec[]> = {
  amounts: [
    ...lead,
    { key: "auditedValue", header: "Audited value", width: 16, fill: true },
    { key: "status", header: "Status", width: 16, fill: true },
    { key: "cause", header: "Cause", width: 20, fill: true },
    { key: "causeNote", header: "Cause detail", width: 30, fill: true },
    { key: "comment", header: "Comment", width: 40, fill: true },
    { key: "misstatement", header: "Misstatement (book − audited)", width: 18 },
    ...hiddenTail,
  ],
  deviations: [
    ...lead,
    { key: "status", header: "Status", width: 16, fill: true },
    { key: "deviation", header: "Deviation (yes/no)", width: 14, fill: true },
    { key: "deviationNature", header: "Nature of deviation", width: 36, fill: true },
    { key: "comment", header: "Comment", width: 40, fill: true },
    ...hiddenTail,
  ],
};

export function workbookKindFor(method: SampleMethod): WorkbookKind {
  return method === "attribute" ? "deviations" : "amounts";
}

export function columnsFor(kind: WorkbookKind): ColumnSpec[] {
  return LAYOUTS[kind];
}

export type ItemStatus = (typeof ITEM_STATUSES)[number];
export type Cause = (typeof MISSTATEMENT_CAUSES)[number];

export const STATUS_LABELS: Record<ItemStatus, string> = {
  "not-started": ITEM_STATUS_LABELS["not-started"],
  done: ITEM_STATUS_LABELS.done,
  "not-auditable": ITEM_STATUS_LABELS["not-auditable"],
};

const byLabel = <T extends string>(labels: Record<T, string>) => {
  const map = new Map<string, T>();
  for (const [code, label] of Object.entries(labels) as [T, string][]) {
    map.set(code.toLowerCase(), code);
    map.set(label.toLowerCase(), code);
  }
  return map;
};
const STATUS_BY_TEXT = new Map([...byLabel(STATUS_LABELS), ...Object.entries(ITEM_STATUS_ALIASES)]);
const CAUSE_BY_TEXT = byLabel(CAUSE_LABELS);

/** A status typed as its label ("Could not be audited", or the older "Not auditable") or its code ("not-auditable"); undefined when neither. */
export const statusFromText = (text: string) => STATUS_BY_TEXT.get(text.trim().toLowerCase());
export const causeFromText = (text: string) => CAUSE_BY_TEXT.get(text.trim().toLowerCase());

/** The results a row carries, normalised the same way whether read from an item or from a sheet. */
export interface RowResult {
  status: ItemStatus;
  auditedValue: string | null;
  cause: Cause | null;
  causeNote: string | null;
  deviation: boolean | null;
  deviationNature: string | null;
  comment: string | null;
}

/**
 * A short digest of the fill-in values as exported, kept in a hidden column: on import a row whose
 * values still match it was not touched, so a stale version on an untouched row is no conflict.
 */
export function resultFingerprint(kind: WorkbookKind, r: RowResult): string {
  const fields =
    kind === "amounts"
      ? [r.status, r.auditedValue, r.cause, r.causeNote, r.comment]
      : [r.status, r.deviation, r.deviationNature, r.comment];
  return createHash("sha256").update(JSON.stringify(fields)).digest("hex").slice(0, 16);
}
