import { withEngagementRole } from "@/lib/auth/with-role";
import { getCurrentDraw } from "@/lib/data/samples";
import { conflict } from "@/lib/errors";
import { saveItemResults } from "@/lib/fieldwork/batch-results";
import { sampleOf } from "@/lib/samples/route-helpers";
import { BatchResultsSchema } from "@/lib/validation/batch-results";

/** Staff and above save several items' results at once (paste, agreed to book, undo): all or nothing. */
export const POST = withEngagementRole(BatchResultsSchema, "staff", async (input, ctx) => {
  const sample = await sampleOf(ctx);
  const draw = await getCurrentDraw(ctx.db, { sampleId: sample.id });
  if (!draw) throw conflict("The sample has not been drawn yet.");
  return saveItemResults(ctx.db, {
    engagementId: ctx.engagementId,
    sampleId: sample.id,
    drawId: draw.id,
    actorId: ctx.user.id,
    batch: input,
  });
});
