import { withFirmAdmin } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { resetUserPassword } from "@/lib/data/users";
import { ResetPasswordSchema } from "@/lib/validation/user";

export const POST = withFirmAdmin(ResetPasswordSchema, async (input, { db, user, params }) => {
  await resetUserPassword(db, { firmId: user.firmId, actorId: user.id, userId: parseIdParam(params.userId, "user"), password: input.password });
});
