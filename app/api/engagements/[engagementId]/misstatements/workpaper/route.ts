import { Readable } from "node:stream";
import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { getSummaryByEngagementId } from "@/lib/data/misstatements";
import { loadSummaryView } from "@/lib/misstatements/summary-view";
import { getObjectStream } from "@/lib/storage/objects";
import { renderSummaryWorkpaper } from "@/templates/misstatements/render-summary";

export const maxDuration = 120;

/** Locked: exactly the bytes stored at lock (`x-content-sha256`); before: a fresh draft watermarked as such. */
export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const settings = await getSummaryByEngagementId(ctx.db, { engagementId: ctx.engagementId });
  if (settings.lock) {
    const object = await getObjectStream({ key: settings.lock.objectKey });
    return new Response(Readable.toWeb(object.body) as ReadableStream, {
      headers: {
        "content-type": "application/pdf",
        "content-disposition": `attachment; filename="${settings.lock.reference}.pdf"`,
        "x-content-sha256": settings.lock.workpaperSha256,
        ...(object.length ? { "content-length": String(object.length) } : {}),
      },
    });
  }
  const view = await loadSummaryView(ctx.db, { engagementId: ctx.engagementId });
  const pdf = await renderSummaryWorkpaper(view, { draft: true });
  return new Response(new Uint8Array(pdf), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="${view.workpaperReference}-DRAFT.pdf"`,
      "cache-control": "no-store",
    },
  });
});
