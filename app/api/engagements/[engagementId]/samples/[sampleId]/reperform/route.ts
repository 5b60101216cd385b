import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { reperformDraw } from "@/lib/samples/reperform";
import { sampleOf } from "@/lib/samples/route-helpers";

export const POST = withEngagementRole(z.object({}), "staff", async (_input, ctx) => ({
  reperform: await reperformDraw(ctx.db, { sample: await sampleOf(ctx), actorId: ctx.user.id }),
}));
