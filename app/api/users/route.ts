import { z } from "zod";
import { withAuditor, withFirmAdmin } from "@/lib/auth/with-role";
import { createUser, listUsersByFirmId } from "@/lib/data/users";
import { CreateUserSchema } from "@/lib/validation/user";

/** Everyone in the audit firm may list its active people (to build a team); admins see everyone; client contacts get 403. */
export const GET = withAuditor(z.object({}), async (_input, { db, user }) => {
  const users = await listUsersByFirmId(db, { firmId: user.firmId, activeOnly: user.firmRole !== "admin" });
  return { users };
});

export const POST = withFirmAdmin(CreateUserSchema, async (input, { db, user }) => {
  const created = await createUser(db, { firmId: user.firmId, actorId: user.id, input });
  return Response.json({ user: created }, { status: 201 });
});
