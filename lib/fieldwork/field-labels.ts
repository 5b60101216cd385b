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
