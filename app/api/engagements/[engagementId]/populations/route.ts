import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { listPopulationsByEngagementId } from "@/lib/data/populations";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, { db, engagementId }) => ({
  populations: await listPopulationsByEngagementId(db, { engagementId }),
}));
