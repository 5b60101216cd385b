import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { evaluationFor } from "@/lib/samples/context";
import { sampleOf } from "@/lib/samples/route-helpers";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const sample = await sampleOf(ctx);
  return { evaluation: await evaluationFor(ctx.db, { engagementId: ctx.engagementId, sampleId: sample.id }) };
});
