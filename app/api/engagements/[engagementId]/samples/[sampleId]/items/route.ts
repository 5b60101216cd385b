import { withEngagementRole } from "@/lib/auth/with-role";
import { getCurrentDraw } from "@/lib/data/samples";
import { listItemsByDrawId } from "@/lib/data/sample-items";
import { sampleOf } from "@/lib/samples/route-helpers";
import { SampleItemsQuerySchema } from "@/lib/validation/sample";

export const GET = withEngagementRole(SampleItemsQuerySchema, "viewer", async (query, ctx) => {
  const sample = await sampleOf(ctx);
  const draw = await getCurrentDraw(ctx.db, { sampleId: sample.id });
  if (!draw) return { items: [], total: 0, page: 1, pageSize: query.pageSize, nextCursor: null, prevCursor: null };
  return listItemsByDrawId(ctx.db, { drawId: draw.id, ...query });
});
