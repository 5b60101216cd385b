import { z } from "zod";
import { uploadFileName } from "@/lib/validation/file-name";
import { withEngagementRole, withEngagementRoleStreaming } from "@/lib/auth/with-role";
import { buildFieldworkWorkbook } from "@/lib/fieldwork/workbook-export";
import { importFieldworkWorkbook, MAX_WORKBOOK_BYTES } from "@/lib/fieldwork/workbook-import";
import { readBodyBytes } from "@/lib/files/read-body";
import { sampleOf } from "@/lib/samples/route-helpers";

const XLSX_TYPE = "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet";

/** The fieldwork workbook of the current draw (cover sheet + Items sheet to fill). */
export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const sample = await sampleOf(ctx);
  const { bytes, fileName } = await buildFieldworkWorkbook(ctx.db, {
    engagementId: ctx.engagementId,
    sampleId: sample.id,
    exportedBy: ctx.user.name,
  });
  return new Response(new Uint8Array(bytes), {
    headers: {
      "content-type": XLSX_TYPE,
      "content-length": String(bytes.length),
      "content-disposition": `attachment; filename="${fileName}"`,
      "cache-control": "no-store",
    },
  });
});

/** A filled workbook as the raw request body (not multipart): all rows applied in one transaction, or none (422 listing problems). */
export const POST = withEngagementRoleStreaming(
  z.object({ fileName: uploadFileName.optional() }),
  "staff",
  async (_query, ctx) => {
    const sample = await sampleOf(ctx);
    const bytes = await readBodyBytes(ctx.req, { maxBytes: MAX_WORKBOOK_BYTES, what: "a fieldwork workbook" });
    return importFieldworkWorkbook(ctx.db, {
      engagementId: ctx.engagementId,
      sampleId: sample.id,
      actorId: ctx.user.id,
      bytes,
    });
  },
);
