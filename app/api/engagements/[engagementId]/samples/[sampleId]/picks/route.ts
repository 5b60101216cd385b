import { withEngagementRole } from "@/lib/auth/with-role";
import { addHaphazardPick } from "@/lib/samples/picks";
import { sampleOf } from "@/lib/samples/route-helpers";
import { HaphazardPickSchema } from "@/lib/validation/sample";

/** A senior (or above) picks an item haphazardly on the population grid; who and when are recorded. */
export const POST = withEngagementRole(HaphazardPickSchema, "senior", async (input, ctx) =>
  Response.json(
    {
      pick: await addHaphazardPick(ctx.db, {
        sample: await sampleOf(ctx),
        actorId: ctx.user.id,
        rowNumber: input.rowNumber,
      }),
    },
    { status: 201 },
  ),
);
