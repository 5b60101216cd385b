import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { getUploadById } from "@/lib/data/population-uploads";
import { problemsToCsv } from "@/lib/imports";

export const GET = withEngagementRole(z.object({}), "senior", async (_input, { db, engagementId, params }) => {
  const upload = await getUploadById(db, { engagementId, uploadId: parseIdParam(params.uploadId, "upload") });
  const name = upload.fileName.replace(/\.[^.]+$/, "").replace(/[^\w.-]+/g, "_");
  return new Response(problemsToCsv(upload.problems, upload.problemCount), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${name}-problems.csv"`,
    },
  });
});
