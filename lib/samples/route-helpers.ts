import "server-only";
import type { EngagementContext } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { getSampleById } from "@/lib/data/samples";

/** The sample named by the route's `sampleId`, on the route's engagement (404 otherwise). */
export function sampleOf(ctx: EngagementContext) {
  return getSampleById(ctx.db, {
    engagementId: ctx.engagementId,
    sampleId: parseIdParam(ctx.params.sampleId, "sample"),
  });
}
