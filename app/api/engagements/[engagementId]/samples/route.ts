import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { createSample, listSamplesByEngagementId } from "@/lib/data/samples";
import { planFor } from "@/lib/samples/context";
import { PlanSampleSchema } from "@/lib/validation/sample";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, { db, engagementId }) => ({
  samples: await listSamplesByEngagementId(db, { engagementId }),
}));

export const POST = withEngagementRole(PlanSampleSchema, "senior", async (input, { db, engagementId, user }) => {
  const planned = await planFor(db, { engagementId, input });
  const sample = await createSample(db, {
    engagementId,
    actorId: user.id,
    input: planned.input,
    plan: planned.plan,
    methodology: planned.methodology,
  });
  return Response.json({ sample }, { status: 201 });
});
