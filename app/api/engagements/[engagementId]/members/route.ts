import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { addMember, listMembersByEngagementId } from "@/lib/data/members";
import { notifyEngagementInvitation } from "@/lib/mail/notify-invitation";
import { AddMemberSchema } from "@/lib/validation/engagement";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, { db, engagementId }) => ({
  members: await listMembersByEngagementId(db, { engagementId }),
}));

export const POST = withEngagementRole(AddMemberSchema, "manager", async (input, { db, engagementId, user, role }) => {
  // The invitation is queued in the mail outbox inside the addition's transaction: both commit, or neither.
  await addMember(db, {
    engagementId,
    actorId: user.id,
    actorRole: role,
    userId: input.userId,
    role: input.role,
    firmId: user.firmId,
    inTransaction: (trx) =>
      notifyEngagementInvitation(trx, {
        engagementId,
        userId: input.userId,
        role: input.role,
        invitedBy: { name: user.name },
      }),
  });
  return Response.json({ members: await listMembersByEngagementId(db, { engagementId }) }, { status: 201 });
});
