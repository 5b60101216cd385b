import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { changeMemberRole, listMembersByEngagementId, removeMember } from "@/lib/data/members";
import { ChangeMemberRoleSchema } from "@/lib/validation/engagement";

export const PATCH = withEngagementRole(
  ChangeMemberRoleSchema,
  "manager",
  async (input, { db, engagementId, user, role, params }) => {
    const userId = parseIdParam(params.userId, "team member");
    await changeMemberRole(db, { engagementId, actorId: user.id, actorRole: role, userId, role: input.role });
    return { members: await listMembersByEngagementId(db, { engagementId }) };
  },
);

export const DELETE = withEngagementRole(
  z.object({}),
  "manager",
  async (_input, { db, engagementId, user, role, params }) => {
    const userId = parseIdParam(params.userId, "team member");
    await removeMember(db, { engagementId, actorId: user.id, actorRole: role, userId });
    return { members: await listMembersByEngagementId(db, { engagementId }) };
  },
);
