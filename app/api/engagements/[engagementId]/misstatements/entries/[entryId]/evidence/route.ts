import { z } from "zod";
import { parseIdParam } from "@/lib/auth/access";
import { withEngagementRole, withEngagementRoleStreaming } from "@/lib/auth/with-role";
import { getEntryById } from "@/lib/data/misstatements";
import { assertMayWriteEvidence } from "@/lib/fieldwork/evidence-access";
import { MAX_EVIDENCE_BYTES } from "@/lib/fieldwork/evidence";
import { EvidenceUploadQuerySchema } from "@/lib/fieldwork/evidence-schemas";
import { readBodyBytes } from "@/lib/files/read-body";
import { addEntryEvidence, listEntryEvidence, publicEntryEvidence } from "@/lib/misstatements/evidence";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const entry = await getEntryById(ctx.db, {
    engagementId: ctx.engagementId,
    entryId: parseIdParam(ctx.params.entryId, "misstatement entry"),
  });
  return { evidence: (await listEntryEvidence(ctx.db, { entryId: entry.id })).map(publicEntryEvidence) };
});

/** The raw file is the request body with `?fileName=`; staff and above. */
export const POST = withEngagementRoleStreaming(EvidenceUploadQuerySchema, "viewer", async ({ fileName }, ctx) => {
  assertMayWriteEvidence(ctx.role);
  const entry = await getEntryById(ctx.db, {
    engagementId: ctx.engagementId,
    entryId: parseIdParam(ctx.params.entryId, "misstatement entry"),
  });
  const bytes = await readBodyBytes(ctx.req, { maxBytes: MAX_EVIDENCE_BYTES, what: "an evidence file" });
  const evidence = await addEntryEvidence(ctx.db, {
    engagementId: ctx.engagementId,
    entryId: entry.id,
    actorId: ctx.user.id,
    fileName,
    bytes,
  });
  return Response.json({ evidence: publicEntryEvidence(evidence) }, { status: 201 });
});
