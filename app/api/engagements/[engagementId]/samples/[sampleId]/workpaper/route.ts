import { Readable } from "node:stream";
import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { getReviewState } from "@/lib/review/review-state";
import { sampleOf } from "@/lib/samples/route-helpers";
import { getObjectStream } from "@/lib/storage/objects";
import { assembleWorkpaper } from "@/lib/workpaper/assemble";
import { renderWorkpaper } from "@/templates/workpaper/render-workpaper";
import { getSampleReviewColumnsById } from "@/lib/data/sample-review";

export const maxDuration = 120;

/** A locked sample serves exactly the bytes stored at lock; before lock, a fresh draft watermarked as such. */
export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const sample = await sampleOf(ctx);
  const review = await getReviewState(ctx.db, { sampleId: sample.id });
  const row = await getSampleReviewColumnsById(ctx.db, { sampleId: sample.id });
  if (review.lock && row.workpaper_object_key) {
    const object = await getObjectStream({ key: row.workpaper_object_key });
    return new Response(Readable.toWeb(object.body) as ReadableStream, {
      headers: {
        "content-type": "application/pdf",
        "content-disposition": `attachment; filename="${review.lock.reference}.pdf"`,
        "x-content-sha256": review.lock.workpaperSha256,
        ...(object.length ? { "content-length": String(object.length) } : {}),
      },
    });
  }
  const pdf = await renderWorkpaper(
    await assembleWorkpaper(ctx.db, { engagementId: ctx.engagementId, sampleId: sample.id, draft: true }),
  );
  return new Response(new Uint8Array(pdf), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="sample-${sample.id}-DRAFT.pdf"`,
      "cache-control": "no-store",
    },
  });
});
