/** The words a person sees for each field of an item's result: grid headers, refusals, the audit trail. */
export const FIELD_LABELS: Record<string, string> = {
  version: "Version",
  status: "Status",
  auditedValue: "Audited value",
  cause: "Cause",
  causeNote: "Cause details",
  deviation: "Deviation",
  deviationNature: "Nature of the deviation",
  comment: "Comment",
};

/** One set of words for an item's status: the grid, the workbook (its drop-down and import), the PDF and the audit trail. */
export const ITEM_STATUS_LABELS = {
  "not-started": "Not started",
  done: "Done",
  "not-auditable": "Could not be audited",
  void: "Void (replaced)",
} as const satisfies Record<"not-started" | "done" | "not-auditable" | "void", string>;

/** Earlier words still read back from workbooks exported before the labels were unified. */
export const ITEM_STATUS_ALIASES: Record<string, "not-started" | "done" | "not-auditable"> = {
  "not auditable": "not-auditable",
  audited: "done",
};
