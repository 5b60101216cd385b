/** Words for the summary's codes, shared by the page, the workbook and the PDF. */
import type { RowKind, SummaryRow } from "./types";
import { formatDate } from "@/lib/format/date";

export const KIND_LABELS: Record<RowKind, string> = {
  factual: "Factual",
  judgemental: "Judgemental",
  projected: "Projected",
  "prior-period": "Prior period",
};

export function treatmentOf(r: SummaryRow): string {
  if (r.corrected) return `Corrected ${formatDate(r.corrected.on, "corrected.on")} (${r.corrected.reference})`;
  if (r.kind === "prior-period") return "Prior period: in the two approaches";
  if (r.clearlyTrivial) return "Clearly trivial: not accumulated";
  return "Uncorrected";
}
