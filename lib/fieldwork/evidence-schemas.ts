import { z } from "zod";

/** The name a file is stored under: the last path segment, without control characters. */
export const EvidenceUploadQuerySchema = z.object({
  fileName: z.string({ error: "fileName: give the file's name (?fileName=…)" })
    .transform((v) => v.split(/[\\/]/).pop()!.replace(/[\u0000-\u001f\u007f]/g, "").trim())
    .pipe(z.string().min(1, "Give the file's name").max(255, "At most 255 characters")),
});

export const EvidenceListQuerySchema = z.object({
  includeDeleted: z.enum(["true", "false"]).default("false").transform((v) => v === "true"),
});
