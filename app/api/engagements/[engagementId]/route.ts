import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { getEngagementById, updateEngagement } from "@/lib/data/engagements";
import { UpdateEngagementSchema } from "@/lib/validation/engagement";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, { db, engagementId, role }) => ({
  engagement: await getEngagementById(db, { engagementId }),
  myRole: role,
}));

export const PATCH = withEngagementRole(
  UpdateEngagementSchema,
  "manager",
  async (input, { db, engagementId, user }) => ({
    engagement: await updateEngagement(db, { engagementId, actorId: user.id, input }),
  }),
);
