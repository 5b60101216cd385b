import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { replaceItem } from "@/lib/samples/extend";
import { sampleOf } from "@/lib/samples/route-helpers";
import { ReplaceItemSchema } from "@/lib/validation/sample";

export const POST = withEngagementRole(ReplaceItemSchema, "senior", async ({ reason }, ctx) => ({
  replacement: await replaceItem(ctx.db, {
    sample: await sampleOf(ctx),
    actorId: ctx.user.id,
    itemId: parseIdParam(ctx.params.itemId, "item"),
    reason,
  }),
}));
