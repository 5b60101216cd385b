import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { getPopulationById } from "@/lib/data/populations";
import { setPopulationArchived } from "@/lib/populations/remove-population";
import { ArchivePopulationSchema } from "@/lib/validation/population-archive";

/** Seniors and above archive a population (kept with its samples, out of the way) or bring it back; audited. */
export const POST = withEngagementRole(
  ArchivePopulationSchema,
  "senior",
  async (input, { db, engagementId, params, user }) => {
    const populationId = parseIdParam(params.populationId, "population");
    await setPopulationArchived(db, { engagementId, populationId, actorId: user.id, archived: input.archived });
    return { population: await getPopulationById(db, { engagementId, populationId }) };
  },
);
