import { withFirmAdmin } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { updateUser } from "@/lib/data/users";
import { UpdateUserSchema } from "@/lib/validation/user";

export const PATCH = withFirmAdmin(UpdateUserSchema, async (input, { db, user, params }) => ({
  user: await updateUser(db, {
    firmId: user.firmId,
    actorId: user.id,
    userId: parseIdParam(params.userId, "user"),
    input,
  }),
}));
