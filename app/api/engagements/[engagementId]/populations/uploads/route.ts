import { withEngagementRoleStreaming } from "@/lib/auth/with-role";
import { receiveUpload } from "@/lib/populations/receive-upload";
import { UploadQuerySchema } from "@/lib/validation/population";

/** The raw file is the request body (not multipart), so it streams to disk as it arrives. */
export const POST = withEngagementRoleStreaming(
  UploadQuerySchema,
  "senior",
  async ({ fileName }, { db, engagementId, user, req }) => {
    const length = req.headers.get("content-length");
    const upload = await receiveUpload(db, {
      engagementId,
      actorId: user.id,
      fileName,
      body: req.body,
      declaredLength: length === null ? null : Number(length),
    });
    return Response.json({ upload }, { status: 201 });
  },
);
