import { withEngagementRole, withEngagementRoleStreaming } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { assertMayWriteEvidence } from "@/lib/fieldwork/evidence-access";
import {
  addItemEvidence,
  getItemOfSample,
  listEvidenceByItemId,
  MAX_EVIDENCE_BYTES,
  publicEvidence,
} from "@/lib/fieldwork/evidence";
import { EvidenceListQuerySchema, EvidenceUploadQuerySchema } from "@/lib/fieldwork/evidence-schemas";
import { readBodyBytes } from "@/lib/files/read-body";
import { sampleOf } from "@/lib/samples/route-helpers";

export const GET = withEngagementRole(EvidenceListQuerySchema, "viewer", async ({ includeDeleted }, ctx) => {
  const sample = await sampleOf(ctx);
  const item = await getItemOfSample(ctx.db, { sampleId: sample.id, itemId: parseIdParam(ctx.params.itemId, "item") });
  return { evidence: (await listEvidenceByItemId(ctx.db, { itemId: item.id, includeDeleted })).map(publicEvidence) };
});

/** The raw file is the request body with `?fileName=`; staff and above (client contacts supply files through request lists). */
export const POST = withEngagementRoleStreaming(EvidenceUploadQuerySchema, "viewer", async ({ fileName }, ctx) => {
  assertMayWriteEvidence(ctx.role);
  const sample = await sampleOf(ctx);
  const item = await getItemOfSample(ctx.db, { sampleId: sample.id, itemId: parseIdParam(ctx.params.itemId, "item") });
  const bytes = await readBodyBytes(ctx.req, { maxBytes: MAX_EVIDENCE_BYTES, what: "an evidence file" });
  const evidence = await addItemEvidence(ctx.db, {
    engagementId: ctx.engagementId,
    sampleId: sample.id,
    itemId: item.id,
    actorId: ctx.user.id,
    fileName,
    bytes,
  });
  return Response.json({ evidence: publicEvidence(evidence) }, { status: 201 });
});
