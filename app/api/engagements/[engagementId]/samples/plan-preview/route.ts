import { withEngagementRole } from "@/lib/auth/with-role";
import { planFor } from "@/lib/samples/context";
import { PreviewPlanSchema } from "@/lib/validation/sample";

/** The sample size and its computation for the parameters being typed; stores nothing. */
export const POST = withEngagementRole(PreviewPlanSchema, "staff", async (input, { db, engagementId }) => ({
  plan: (await planFor(db, { engagementId, input })).plan,
}));
