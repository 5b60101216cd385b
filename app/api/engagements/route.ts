import { z } from "zod";
import { withUser } from "@/lib/auth/with-role";
import { gradeMayCreateEngagement } from "@/lib/auth/roles";
import { createEngagement, listEngagementsByUserId } from "@/lib/data/engagements";
import { CreateEngagementSchema } from "@/lib/validation/engagement";
import { forbidden } from "@/lib/errors";

export const GET = withUser(z.object({}), async (_input, { db, user }) => ({
  engagements: await listEngagementsByUserId(db, { userId: user.id }),
}));

export const POST = withUser(z.unknown(), async (raw, { db, user }) => {
  if (!gradeMayCreateEngagement(user.grade)) throw forbidden("Only managers and partners can create engagements.");
  const input = CreateEngagementSchema.parse(raw);
  const engagement = await createEngagement(db, { firmId: user.firmId, actorId: user.id, input });
  return Response.json({ engagement }, { status: 201 });
});
