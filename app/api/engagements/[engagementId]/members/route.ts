import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { addMember, listMembersByEngagementId } from "@/lib/data/members";
import { AddMemberSchema } from "@/lib/validation/engagement";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, { db, engagementId }) => ({
  members: await listMembersByEngagementId(db, { engagementId }),
}));

export const POST = withEngagementRole(AddMemberSchema, "manager", async (input, { db, engagementId, user, role }) => {
  await addMember(db, { engagementId, actorId: user.id, actorRole: role, userId: input.userId, role: input.role, firmId: user.firmId });
  return Response.json({ members: await listMembersByEngagementId(db, { engagementId }) }, { status: 201 });
});
