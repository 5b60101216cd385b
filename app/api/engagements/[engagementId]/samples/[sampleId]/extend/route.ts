import { withEngagementRole } from "@/lib/auth/with-role";
import { extendSample } from "@/lib/samples/extend";
import { sampleOf } from "@/lib/samples/route-helpers";
import { ExtendSchema } from "@/lib/validation/sample";

export const POST = withEngagementRole(ExtendSchema, "senior", async (input, ctx) => ({
  extension: await extendSample(ctx.db, { sample: await sampleOf(ctx), actorId: ctx.user.id, ...input }),
}));
