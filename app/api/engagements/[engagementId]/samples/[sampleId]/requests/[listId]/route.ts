import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { teamListView } from "@/lib/requests/views";
import { listOf } from "@/lib/requests/route-helpers";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) =>
  teamListView(ctx.db, await listOf(ctx)),
);
