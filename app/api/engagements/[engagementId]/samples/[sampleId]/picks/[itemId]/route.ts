import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { removeHaphazardPick } from "@/lib/samples/picks";
import { sampleOf } from "@/lib/samples/route-helpers";

/** Takes back a haphazard pick without a result. */
export const DELETE = withEngagementRole(z.object({}), "senior", async (_input, ctx) => {
  await removeHaphazardPick(ctx.db, {
    sample: await sampleOf(ctx),
    actorId: ctx.user.id,
    itemId: parseIdParam(ctx.params.itemId, "item"),
  });
  return { removed: true };
});
