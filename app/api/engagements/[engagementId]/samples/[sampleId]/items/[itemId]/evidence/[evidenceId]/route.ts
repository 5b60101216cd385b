import { Readable } from "node:stream";
import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { assertMayWriteEvidence } from "@/lib/fieldwork/evidence-access";
import { deleteItemEvidence, getEvidenceById, getItemOfSample } from "@/lib/fieldwork/evidence";
import { getObjectStream } from "@/lib/storage/objects";
import { sampleOf } from "@/lib/samples/route-helpers";

/** The file exactly as uploaded, always as an attachment that the browser must not sniff. */
export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const sample = await sampleOf(ctx);
  const item = await getItemOfSample(ctx.db, { sampleId: sample.id, itemId: parseIdParam(ctx.params.itemId, "item") });
  const evidence = await getEvidenceById(ctx.db, { itemId: item.id, evidenceId: parseIdParam(ctx.params.evidenceId, "evidence file") });
  const object = await getObjectStream({ key: evidence.objectKey });
  const asciiName = evidence.fileName.replace(/[^\x20-\x7e]|["\\]/g, "_");
  return new Response(Readable.toWeb(object.body) as ReadableStream, {
    headers: {
      "content-type": evidence.contentType,
      "content-length": String(evidence.sizeBytes),
      "content-disposition": `attachment; filename="${asciiName}"; filename*=UTF-8''${encodeURIComponent(evidence.fileName)}`,
      "x-content-type-options": "nosniff",
      "content-security-policy": "sandbox",
      "x-content-sha256": evidence.sha256,
      "cache-control": "private, no-store",
    },
  });
});

/** Soft delete (kept in the audit trail): staff and above, or the client contact who uploaded it. */
export const DELETE = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  assertMayWriteEvidence(ctx.role, ctx.user.grade);
  const sample = await sampleOf(ctx);
  await deleteItemEvidence(ctx.db, {
    engagementId: ctx.engagementId, sampleId: sample.id, itemId: parseIdParam(ctx.params.itemId, "item"),
    evidenceId: parseIdParam(ctx.params.evidenceId, "evidence file"), actorId: ctx.user.id, role: ctx.role,
  });
});
