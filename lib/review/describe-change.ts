import {
  CAUSE_LABELS,
  CONTROL_FREQUENCY_LABELS,
  DIRECTION_LABELS,
  ESTIMATOR_LABELS,
  METHOD_LABELS,
} from "@/lib/validation/sample";
import { RISK_LEVEL_LABELS } from "@/lib/validation/methodology";
import { FIELD_LABELS, ITEM_STATUS_LABELS } from "@/lib/fieldwork/field-labels";
import { formatDate, formatDateTime } from "@/lib/format/date";
import { formatBytes, formatMoney } from "@/lib/format/number";
import { REQUEST_NEED_LABELS } from "@/lib/validation/requests";
import { planKeysFor } from "@/lib/validation/plan-keys";

/**
 * One audit-log row as people read it, on the trail page and in the locked workpaper's appendix:
 * what happened in words, what it was about (the item's reference, the file, the note), and each
 * field that changed by its label with its value as the screen shows it — never raw JSON or table
 * names. Pure, so the page and the PDF print the same words.
 */
export interface ReadableChange {
  what: string;
  subject: string | null;
  changes: { field: string; before: string; after: string }[];
}

export interface ChangeSource {
  entity: string;
  entityId: string;
  action: string;
  before: unknown;
  after: unknown;
}

/** The references of the sample's items, by item id, and the names of its evidence files, by evidence id. */
export interface ChangeContext {
  itemRefs: Map<string, string>;
  evidenceNames?: Map<string, string>;
  populationNames?: Map<string, string>;
}

const ACTIONS: Record<string, string> = {
  plan: "Planned the sample",
  replan: "Changed the plan",
  draw: "Drew the sample",
  redraw: "Drew the sample again",
  reperform: "Re-performed the selection",
  extend: "Extended the sample",
  "void-and-replace": "Replaced an item",
  "record-result": "Recorded a result",
  "import-workbook": "Imported the fieldwork workbook",
  "import-results": "Imported results",
  upload: "Attached evidence",
  delete: "Removed evidence",
  "preparer-sign-off": "Signed off as preparer",
  "reviewer-sign-off": "Signed off as reviewer",
  "sign-offs-cleared": "Sign-offs cleared by a change",
  raise: "Raised a review note",
  answer: "Answered a review note",
  clear: "Cleared a review note",
  lock: "Locked the sample",
  unlock: "Unlocked the sample",
  "adopt-advisor-run": "Adopted the estimator advisor's choice",
  start: "Ran the estimator advisor",
  create: "Sent a client request list",
  close: "Closed a client request list",
  "client-upload": "Client uploaded a file",
  "client-note": "Client wrote a note",
  accept: "Accepted a client's file as evidence",
  "accept-client-file": "Accepted a client's file as evidence",
  return: "Sent a client's file back",
  "overdue-reminder": "Reminded the client of overdue items",
};

const KEY_LABELS: Record<string, string> = {
  ...FIELD_LABELS,
  reason: "Reason",
  seed: "Seed",
  seedSource: "Seed from",
  items: "Items",
  algorithm: "Algorithm",
  text: "Note",
  itemId: "Item",
  workpaperSha256: "Workpaper SHA-256",
  sha256: "SHA-256",
  fileName: "File",
  bytes: "Size (bytes)",
  sizeBytes: "Size",
  reference: "Workpaper reference",
  role: "Role",
  title: "Title",
  populationId: "Population",
  name: "Name",
  objective: "Objective",
  assertion: "Assertion",
  direction: "Direction",
  params: "Plan",
  method: "Method",
  estimator: "Estimator",
  confidence: "Confidence",
  tolerableMisstatement: "Tolerable misstatement",
  expectedMisstatement: "Expected misstatement",
  sampleSize: "Sample size",
  sizeReason: "Why this size",
  computedSize: "Computed size",
  chosenSize: "Chosen size",
  additional: "Items added",
  matches: "Matches",
  preparerSignedAt: "Preparer signed",
  reviewerSignedAt: "Reviewer signed",
  reviewerSignOff: "Reviewer sign-off",
  changed: "Changed",
  unchanged: "Unchanged",
  rows: "Rows",
  status_: "Status",
  replacedBy: "Replaced by",
  replacement: "Replacement",
  note: "Note",
  lockedAt: "Locked",
  workpaperObjectKey: "Stored workpaper",
};

/** Codes of plan choices as the plan form words them. */
const CHOICE_LABELS: Record<string, Record<string, string>> = {
  sizingBasis: { "risk-assessment": "From the risk assessment", "confidence-override": "Typed confidence" },
  assessedRisk: RISK_LEVEL_LABELS,
  otherProceduresRisk: RISK_LEVEL_LABELS,
  controlFrequency: CONTROL_FREQUENCY_LABELS,
  selection: { random: "Random", systematic: "Systematic", haphazard: "Haphazard", block: "Block" },
  projection: { ratio: "Ratio", difference: "Difference" },
  attributePlan: { fixed: "Fixed", "two-stage": "Two-stage" },
  attributeMode: { statistical: "Statistical", "control-frequency": "By control frequency" },
  spreadBasis: { "book-values": "Book values", "prior-sample": "An earlier sample", entered: "Entered figure" },
};

const HIDDEN_KEYS = new Set(["contactUserId", "sampleItemId"]);
/** Fractions people read as percentages. */
const RATE_KEYS = new Set([
  "confidence",
  "riskOfIncorrectRejection",
  "riskOfIncorrectAcceptance",
  "expectedRate",
  "tolerableRate",
]);

const humanise = (key: string) =>
  KEY_LABELS[key] ??
  key
    .replace(/([a-z])([A-Z])/g, "$1 $2")
    .replace(/[-_]/g, " ")
    .replace(/^./, (c) => c.toUpperCase())
    .replace(/ ([A-Z])/g, (_m, c: string) => ` ${c.toLowerCase()}`);
const MONEY_KEYS = new Set([
  "auditedValue",
  "bookValue",
  "tolerableMisstatement",
  "expectedMisstatement",
  "total",
  "controlTotal",
]);

/** A value as the screen shows it: labels for codes, grouped amounts, dates in the product's format. */
export function showValue(key: string, v: unknown, ctx?: ChangeContext): string {
  if (v === null || v === undefined || v === "") return "—";
  if (key === "status" && typeof v === "string" && v in ITEM_STATUS_LABELS)
    return ITEM_STATUS_LABELS[v as keyof typeof ITEM_STATUS_LABELS];
  if (key === "cause" && typeof v === "string" && v in CAUSE_LABELS)
    return CAUSE_LABELS[v as keyof typeof CAUSE_LABELS];
  if (key === "method" && typeof v === "string" && v in METHOD_LABELS)
    return METHOD_LABELS[v as keyof typeof METHOD_LABELS];
  if (key === "direction" && typeof v === "string" && v in DIRECTION_LABELS)
    return DIRECTION_LABELS[v as keyof typeof DIRECTION_LABELS];
  if (typeof v === "string" && CHOICE_LABELS[key]?.[v]) return CHOICE_LABELS[key][v];
  if (key === "deviation" && typeof v === "boolean") return v ? "Deviation" : "No deviation";
  if (key === "estimator" && typeof v === "string" && v in ESTIMATOR_LABELS) return ESTIMATOR_LABELS[v];
  if (key === "populationId" && ctx?.populationNames)
    return ctx.populationNames.get(String(v)) ?? "a population since removed";
  if (key === "itemId" && ctx) return ctx.itemRefs.get(String(v)) ?? `an item no longer in the draw`;
  if (MONEY_KEYS.has(key) && /^-?\d+(\.\d+)?$/.test(String(v))) return formatMoney(String(v));
  if (RATE_KEYS.has(key) && typeof v === "number") return `${Number((v * 100).toPrecision(6))}%`;
  if (key === "seed" && typeof v === "number") return String(v);
  if (key === "sizeBytes" && typeof v === "number") return formatBytes(v);
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (key === "needs" && typeof v === "string" && v in REQUEST_NEED_LABELS)
    return REQUEST_NEED_LABELS[v as keyof typeof REQUEST_NEED_LABELS];
  if (typeof v === "string" && /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/.test(v)) return formatDateTime(v);
  if (typeof v === "string" && /^\d{4}-\d{2}-\d{2}$/.test(v)) return formatDate(v);
  if (typeof v === "number") return v.toLocaleString("en-US", { maximumFractionDigits: 6 });
  if (Array.isArray(v)) return v.map((x) => showValue(key, x, ctx)).join(", ");
  if (key === "params" && typeof v === "object") {
    const params = v as Record<string, unknown>;
    const used = new Set(planKeysFor(params));
    return Object.entries(params)
      .filter(([k, x]) => used.has(k) && x !== undefined)
      .map(([k, x]) => `${humanise(k)} ${showValue(k, x, ctx)}`)
      .join("; ");
  }
  if (typeof v === "object")
    return Object.entries(v as Record<string, unknown>)
      .map(([k, x]) => `${humanise(k)} ${showValue(k, x, ctx)}`)
      .join("; ");
  return String(v);
}

const asRecord = (v: unknown): Record<string, unknown> =>
  v && typeof v === "object" && !Array.isArray(v)
    ? (v as Record<string, unknown>)
    : v === null || v === undefined
      ? {}
      : { value: v };

function subjectOf(e: ChangeSource, ctx: ChangeContext): string | null {
  if (e.entity === "sample_item") return `Item ${ctx.itemRefs.get(e.entityId) ?? e.entityId}`;
  if (e.entity === "item_evidence") return ctx.evidenceNames?.get(e.entityId) ?? "an evidence file";
  if (e.entity === "review_note") return "Review note";
  if (e.entity === "request_list") return "Client request list";
  return null;
}

export function describeChange(e: ChangeSource, ctx: ChangeContext): ReadableChange {
  const before = asRecord(e.before);
  const after = asRecord(e.after);
  // Internal ids a person cannot read (the contact is named in the request list itself) are left out.
  const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])].filter((k) => !HIDDEN_KEYS.has(k));
  const both = e.before !== null && e.before !== undefined && e.after !== null && e.after !== undefined;
  const changes = keys
    .map((k) => ({
      key: k,
      before: k in before ? showValue(k, before[k], ctx) : "—",
      after: k in after ? showValue(k, after[k], ctx) : "—",
    }))
    .filter((c) => !both || c.before !== c.after)
    .map((c) => ({ field: humanise(c.key), before: c.before, after: c.after }));
  return { what: ACTIONS[e.action] ?? humanise(e.action), subject: subjectOf(e, ctx), changes };
}
