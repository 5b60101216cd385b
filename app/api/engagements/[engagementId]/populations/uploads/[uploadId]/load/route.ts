import { withEngagementRole } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { getUploadById } from "@/lib/data/population-uploads";
import { streamPopulationLoad } from "@/lib/populations/stream-load";
import { LoadPopulationSchema } from "@/lib/validation/population";

// Loads can take a while for a million rows; the answer streams progress as NDJSON lines.
export const maxDuration = 600;

export const POST = withEngagementRole(
  LoadPopulationSchema,
  "senior",
  async (input, { db, engagementId, user, params }) => {
    const upload = await getUploadById(db, { engagementId, uploadId: parseIdParam(params.uploadId, "upload") });
    return streamPopulationLoad(db, { upload, actorId: user.id, input });
  },
);
