import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { notifyClientInvitation } from "@/lib/mail/notify-requests";
import type { MailResult } from "@/lib/mail/send";
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
    let mail: MailResult | null = null;
    // The invitation is queued in the mail outbox inside the invitation's transaction: both commit, or neither.
    const invited = await inviteClientContact(db, {
      engagementId,
      firmId: user.firmId,
      actorId: user.id,
      input,
      inTransaction: async (trx, contact) => {
        mail = await notifyClientInvitation(trx, {
          engagementId,
          contact: { name: contact.name, email: contact.email },
          token: contact.token,
          invitedBy: { name: user.name },
          firmId: user.firmId,
        });
      },
    });
    return Response.json(
      {
        contact: {
          userId: invited.userId,
          name: invited.name,
          email: invited.email,
          invitationSent: (mail as MailResult | null)?.sent ?? false,
        },
        contacts: await listClientContactsByEngagementId(db, { engagementId }),
      },
      { status: 201 },
    );
  },
);
