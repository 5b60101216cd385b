import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { getPopulationById } from "@/lib/data/populations";
import { deleteUnusedPopulation } from "@/lib/populations/remove-population";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, { db, engagementId, params }) => ({
  population: await getPopulationById(db, {
    engagementId,
    populationId: parseIdParam(params.populationId, "population"),
  }),
}));

/** Seniors and above delete a population nobody used (audited); one in use answers 409: archive it instead. */
export const DELETE = withEngagementRole(z.object({}), "senior", async (_input, { db, engagementId, params, user }) => {
  await deleteUnusedPopulation(db, {
    engagementId,
    populationId: parseIdParam(params.populationId, "population"),
    actorId: user.id,
  });
});
