import { withEngagementRole } from "@/lib/auth/with-role";
import { drawSample } from "@/lib/samples/draw";
import { loadSampleView } from "@/lib/samples/context";
import { sampleOf } from "@/lib/samples/route-helpers";
import { DrawSchema } from "@/lib/validation/sample";

export const POST = withEngagementRole(DrawSchema, "senior", async ({ seed }, ctx) => {
  const sample = await sampleOf(ctx);
  await drawSample(ctx.db, { sample, actorId: ctx.user.id, seed });
  return Response.json(await loadSampleView(ctx.db, { engagementId: ctx.engagementId, sampleId: sample.id }), {
    status: 201,
  });
});
