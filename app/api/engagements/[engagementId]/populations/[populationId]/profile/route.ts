import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { getPopulationById } from "@/lib/data/populations";
import { getPopulationProfile } from "@/lib/data/population-items";
import { ProfileQuerySchema } from "@/lib/validation/population";

export const GET = withEngagementRole(
  ProfileQuerySchema,
  "viewer",
  async ({ threshold }, { db, engagementId, params }) => {
    const population = await getPopulationById(db, {
      engagementId,
      populationId: parseIdParam(params.populationId, "population"),
    });
    return { population, profile: await getPopulationProfile(db, { populationId: population.id, threshold }) };
  },
);
