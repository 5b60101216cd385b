import { withEngagementRole } from "@/lib/auth/with-role";
import { listSampleAuditTrail } from "@/lib/review/audit-trail";
import { sampleOf } from "@/lib/samples/route-helpers";
import { AuditQuerySchema } from "@/lib/validation/review";

export const GET = withEngagementRole(AuditQuerySchema, "staff", async (query, ctx) => ({
  entries: await listSampleAuditTrail(ctx.db, { sampleId: (await sampleOf(ctx)).id, query }),
}));
