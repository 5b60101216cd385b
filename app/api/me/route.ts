import { z } from "zod";
import { withUser } from "@/lib/auth/with-role";

export const GET = withUser(z.object({}), async (_input, { user }) => ({ user }));
