import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { recipeForSample } from "@/lib/samples/recipe-for-sample";
import { sampleOf } from "@/lib/samples/route-helpers";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const sample = await sampleOf(ctx);
  const text = await recipeForSample(ctx.db, { sample });
  return new Response(text, {
    headers: {
      "content-type": "text/plain; charset=utf-8",
      "content-disposition": `attachment; filename="sample-${sample.id}-reproduction.txt"`,
    },
  });
});
