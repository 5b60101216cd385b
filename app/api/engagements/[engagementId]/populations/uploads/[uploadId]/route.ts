import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { reinspectUpload } from "@/lib/populations/receive-upload";
import { InspectQuerySchema } from "@/lib/validation/population";

export const GET = withEngagementRole(
  InspectQuerySchema,
  "senior",
  async ({ sheet }, { db, engagementId, params }) => ({
    upload: await reinspectUpload(db, { engagementId, uploadId: parseIdParam(params.uploadId, "upload"), sheet }),
  }),
);
