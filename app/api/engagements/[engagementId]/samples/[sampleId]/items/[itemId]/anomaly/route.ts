import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { clearAnomaly, markAnomaly } from "@/lib/samples/anomalies";
import { sampleOf } from "@/lib/samples/route-helpers";
import { AnomalySchema } from "@/lib/validation/sample";

/** Staff and above mark a misstatement anomalous with its justification; it counts once a manager accepts it. */
export const POST = withEngagementRole(AnomalySchema, "staff", async (input, ctx) => {
  await markAnomaly(ctx.db, {
    sample: await sampleOf(ctx),
    actorId: ctx.user.id,
    itemId: parseIdParam(ctx.params.itemId, "item"),
    justification: input.justification,
  });
  return { marked: true };
});

/** Withdraws the mark and any acceptance. */
export const DELETE = withEngagementRole(z.object({}), "staff", async (_input, ctx) => {
  await clearAnomaly(ctx.db, {
    sample: await sampleOf(ctx),
    actorId: ctx.user.id,
    itemId: parseIdParam(ctx.params.itemId, "item"),
  });
  return { cleared: true };
});
