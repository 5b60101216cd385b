import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { notifyClientInvitation } from "@/lib/mail/notify-requests";
import { listClientContactsByEngagementId } from "@/lib/data/members";
import { inviteClientContact } from "@/lib/requests/contacts";
import { InviteClientContactSchema } from "@/lib/validation/requests";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, { db, engagementId }) => ({
  contacts: await listClientContactsByEngagementId(db, { engagementId }),
}));

/** A senior or above invites a client contact to this engagement (a new account gets a one-time link to choose a password). */
export const POST = withEngagementRole(
  InviteClientContactSchema,
  "senior",
  async (input, { db, engagementId, user }) => {
    const invited = await inviteClientContact(db, { engagementId, firmId: user.firmId, actorId: user.id, input });
    const mail = await notifyClientInvitation(db, {
      engagementId,
      contact: { name: invited.name, email: invited.email },
      token: invited.token,
      invitedBy: { name: user.name },
      firmId: user.firmId,
    });
    return Response.json(
      {
        contact: { userId: invited.userId, name: invited.name, email: invited.email, invitationSent: mail.sent },
        contacts: await listClientContactsByEngagementId(db, { engagementId }),
      },
      { status: 201 },
    );
  },
);
