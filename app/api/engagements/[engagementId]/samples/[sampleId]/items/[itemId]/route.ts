import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { getCurrentDraw } from "@/lib/data/samples";
import { saveItemResult } from "@/lib/data/sample-items";
import { conflict } from "@/lib/errors";
import { sampleOf } from "@/lib/samples/route-helpers";
import { SaveResultSchema } from "@/lib/validation/sample";

/** Staff and above record results; `version` is the item version the form was opened with. */
export const PATCH = withEngagementRole(SaveResultSchema, "staff", async (input, ctx) => {
  const sample = await sampleOf(ctx);
  const draw = await getCurrentDraw(ctx.db, { sampleId: sample.id });
  if (!draw) throw conflict("The sample has not been drawn yet.");
  return saveItemResult(ctx.db, {
    engagementId: ctx.engagementId,
    sampleId: sample.id,
    drawId: draw.id,
    itemId: parseIdParam(ctx.params.itemId, "item"),
    actorId: ctx.user.id,
    input,
  });
});
