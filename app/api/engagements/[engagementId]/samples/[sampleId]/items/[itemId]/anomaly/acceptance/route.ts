import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { acceptAnomaly } from "@/lib/samples/anomalies";
import { sampleOf } from "@/lib/samples/route-helpers";

/** A manager or partner accepts an anomaly mark (ISA 530 ¶13 requires a high degree of certainty). */
export const POST = withEngagementRole(
  z.object({ confirm: z.literal(true, "Confirm the acceptance") }),
  "manager",
  async (_input, ctx) => {
    await acceptAnomaly(ctx.db, {
      sample: await sampleOf(ctx),
      actorId: ctx.user.id,
      itemId: parseIdParam(ctx.params.itemId, "item"),
    });
    return { accepted: true };
  },
);
