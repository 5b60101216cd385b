import { Readable } from "node:stream";
import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { getPopulationById } from "@/lib/data/populations";
import { getObjectStream } from "@/lib/storage/objects";

/** The ledger file exactly as received (its SHA-256 is on the population). */
export const GET = withEngagementRole(z.object({}), "viewer", async (_input, { db, engagementId, params }) => {
  const population = await getPopulationById(db, {
    engagementId,
    populationId: parseIdParam(params.populationId, "population"),
  });
  const object = await getObjectStream({ key: population.sourceObjectKey });
  const fileName = population.sourceFileName.replace(/["\\\r\n]/g, "_");
  return new Response(Readable.toWeb(object.body) as ReadableStream, {
    headers: {
      "content-type": object.contentType ?? "application/octet-stream",
      ...(object.length !== undefined ? { "content-length": String(object.length) } : {}),
      "content-disposition": `attachment; filename="${fileName}"; filename*=UTF-8''${encodeURIComponent(population.sourceFileName)}`,
      "x-content-sha256": population.sourceSha256,
    },
  });
});
