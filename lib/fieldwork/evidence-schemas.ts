import { z } from "zod";
import { uploadFileName } from "@/lib/validation/file-name";

export const EvidenceUploadQuerySchema = z.object({ fileName: uploadFileName });

export const EvidenceListQuerySchema = z.object({
  includeDeleted: z
    .enum(["true", "false"])
    .default("false")
    .transform((v) => v === "true"),
});
