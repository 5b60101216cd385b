import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { reconcilePopulation } from "@/lib/data/populations";
import { ReconcileSchema } from "@/lib/validation/population";

export const POST = withEngagementRole(
  ReconcileSchema,
  "senior",
  async (input, { db, engagementId, user, params }) => ({
    population: await reconcilePopulation(db, {
      engagementId,
      populationId: parseIdParam(params.populationId, "population"),
      actorId: user.id,
      input,
    }),
  }),
);
