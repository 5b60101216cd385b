import { z } from "zod";
import { withAuditor } from "@/lib/auth/with-role";
import { getInboxByUserId } from "@/lib/review/inbox";

/** The signed-in auditor's samples awaiting their review, lock, answer or clearing, across engagements. */
export const GET = withAuditor(z.object({}), async (_input, { db, user }) => getInboxByUserId(db, { userId: user.id }));
