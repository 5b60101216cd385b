import { z } from "zod";
import { withFirmAdmin } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { resetPasswordWithLink } from "@/lib/people/invite-staff";

/** An administrator resets a password: it stops working, the person's sessions end, and they are e-mailed a link to choose a new one. */
export const POST = withFirmAdmin(z.object({}), async (_input, { db, user, params }) => {
  const { mail } = await resetPasswordWithLink(db, {
    firmId: user.firmId,
    actorId: user.id,
    userId: parseIdParam(params.userId, "user"),
    invitedBy: { name: user.name },
  });
  return { invitationSent: mail.sent };
});
