import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { loadSummaryView } from "@/lib/misstatements/summary-view";

/** The engagement's summary of misstatements: rows, totals, materiality, status, review (the page's own view model). */
export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => ({
  summary: await loadSummaryView(ctx.db, { engagementId: ctx.engagementId }),
}));
