import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { lockSummary } from "@/lib/misstatements/review";
import { loadSummaryView } from "@/lib/misstatements/summary-view";
import { renderSummaryWorkpaper } from "@/templates/misstatements/render-summary";

export const maxDuration = 120;

/** Manager+, once every sample feeding the summary is locked: the PDF is rendered once and stored with its SHA-256. */
export const POST = withEngagementRole(z.object({}), "manager", async (_input, ctx) => {
  const locked = await lockSummary(ctx.db, {
    engagementId: ctx.engagementId,
    actor: { id: ctx.user.id, name: ctx.user.name },
    role: ctx.role,
    render: (view) => renderSummaryWorkpaper(view, { draft: false }),
  });
  return { locked, summary: await loadSummaryView(ctx.db, { engagementId: ctx.engagementId }) };
});
