import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { getPopulationById } from "@/lib/data/populations";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, { db, engagementId, params }) => ({
  population: await getPopulationById(db, { engagementId, populationId: parseIdParam(params.populationId, "population") }),
}));
