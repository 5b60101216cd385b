import { z } from "zod";
import { parseIdParam } from "@/lib/auth/access";
import { withEngagementRole } from "@/lib/auth/with-role";
import { getEntryById } from "@/lib/data/misstatements";
import { assertMayWriteEvidence } from "@/lib/fieldwork/evidence-access";
import { storedFileResponse } from "@/lib/files/download";
import { deleteEntryEvidence, getEntryEvidence } from "@/lib/misstatements/evidence";

export const GET = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  const entry = await getEntryById(ctx.db, {
    engagementId: ctx.engagementId,
    entryId: parseIdParam(ctx.params.entryId, "misstatement entry"),
  });
  return storedFileResponse(
    await getEntryEvidence(ctx.db, {
      entryId: entry.id,
      evidenceId: parseIdParam(ctx.params.evidenceId, "evidence file"),
    }),
  );
});

export const DELETE = withEngagementRole(z.object({}), "viewer", async (_input, ctx) => {
  assertMayWriteEvidence(ctx.role);
  await deleteEntryEvidence(ctx.db, {
    engagementId: ctx.engagementId,
    entryId: parseIdParam(ctx.params.entryId, "misstatement entry"),
    evidenceId: parseIdParam(ctx.params.evidenceId, "evidence file"),
    actorId: ctx.user.id,
  });
});
