import { z } from "zod";
import { withAuditor, withFirmAdmin } from "@/lib/auth/with-role";
import { listUsersByFirmId } from "@/lib/data/users";
import { inviteFirmPerson } from "@/lib/people/invite-staff";
import { CreateUserSchema } from "@/lib/validation/user";

/** Everyone in the audit firm may list its active people (to build a team); admins see everyone; client contacts get 403. */
export const GET = withAuditor(z.object({}), async (_input, { db, user }) => {
  const users = await listUsersByFirmId(db, { firmId: user.firmId, activeOnly: user.firmRole !== "admin" });
  return { users };
});

/** An administrator adds a person, who is e-mailed a one-time link to choose their own password (queued with the addition). */
export const POST = withFirmAdmin(CreateUserSchema, async (input, { db, user }) => {
  const { user: created, mail } = await inviteFirmPerson(db, {
    firmId: user.firmId,
    actorId: user.id,
    input,
    invitedBy: { name: user.name },
  });
  return Response.json({ user: created, invitationSent: mail.sent }, { status: 201 });
});
