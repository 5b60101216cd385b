import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { summaryWorkbook } from "@/lib/misstatements/workbook";
import { loadSummaryView } from "@/lib/misstatements/summary-view";

/** The schedule as .xlsx: the same view model as the page; every text cell guarded against formulas. */
export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const view = await loadSummaryView(ctx.db, { engagementId: ctx.engagementId });
  const bytes = await summaryWorkbook(view);
  return new Response(new Uint8Array(bytes), {
    headers: {
      "content-type": "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet",
      "content-disposition": `attachment; filename="${view.workpaperReference}${view.review.lock ? "" : "-DRAFT"}.xlsx"`,
      "cache-control": "no-store",
    },
  });
});
