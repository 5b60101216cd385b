import { parseIdParam } from "@/lib/auth/access";
import { withClientRequestStreaming } from "@/lib/auth/with-client";
import { MAX_EVIDENCE_BYTES } from "@/lib/fieldwork/evidence";
import { EvidenceUploadQuerySchema } from "@/lib/fieldwork/evidence-schemas";
import { readBodyBytes } from "@/lib/files/read-body";
import { addClientFile } from "@/lib/requests/files";

/** One file per call (the raw body, `?fileName=`), with the same types and size limit as evidence; the page sends several in turn. */
export const POST = withClientRequestStreaming(
  EvidenceUploadQuerySchema,
  async ({ fileName }, { db, list, user, params, req }) => {
    const requestItemId = parseIdParam(params.requestItemId, "item");
    const bytes = await readBodyBytes(req, { maxBytes: MAX_EVIDENCE_BYTES, what: "a file" });
    const file = await addClientFile(db, { list, requestItemId, actorId: user.id, fileName, bytes });
    return Response.json({ file }, { status: 201 });
  },
);
