import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { getPopulationById } from "@/lib/data/populations";
import { listItemsByPopulationId } from "@/lib/data/population-items";
import { ItemsQuerySchema } from "@/lib/validation/population";

export const GET = withEngagementRole(ItemsQuerySchema, "viewer", async (query, { db, engagementId, params }) => {
  const population = await getPopulationById(db, {
    engagementId,
    populationId: parseIdParam(params.populationId, "population"),
  });
  return listItemsByPopulationId(db, { populationId: population.id, rowCount: population.rowCount, query });
});
