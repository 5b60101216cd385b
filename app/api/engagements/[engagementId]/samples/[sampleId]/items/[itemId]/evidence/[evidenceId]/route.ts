import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { assertMayWriteEvidence } from "@/lib/fieldwork/evidence-access";
import { deleteItemEvidence, getEvidenceById, getItemOfSample } from "@/lib/fieldwork/evidence";
import { storedFileResponse } from "@/lib/files/download";
import { sampleOf } from "@/lib/samples/route-helpers";

/** The file exactly as uploaded, always as an attachment that the browser must not sniff. */
export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const sample = await sampleOf(ctx);
  const item = await getItemOfSample(ctx.db, { sampleId: sample.id, itemId: parseIdParam(ctx.params.itemId, "item") });
  const evidence = await getEvidenceById(ctx.db, {
    itemId: item.id,
    evidenceId: parseIdParam(ctx.params.evidenceId, "evidence file"),
  });
  return storedFileResponse(evidence);
});

/** Soft delete (kept in the audit trail): staff and above. */
export const DELETE = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  assertMayWriteEvidence(ctx.role);
  const sample = await sampleOf(ctx);
  await deleteItemEvidence(ctx.db, {
    engagementId: ctx.engagementId,
    sampleId: sample.id,
    itemId: parseIdParam(ctx.params.itemId, "item"),
    evidenceId: parseIdParam(ctx.params.evidenceId, "evidence file"),
    actorId: ctx.user.id,
    role: ctx.role,
  });
});
