import { z } from "zod";
import { withUser } from "@/lib/auth/with-role";

export const GET = withUser(z.object({}), (_input, { user }) => Promise.resolve({ user }));
