import { z } from "zod";

/**
 * The name of an uploaded file, as a browser sends it: a base name only. Path separators, "." / ".."
 * and control characters are refused (400 naming fileName) rather than silently changed, so a
 * crafted name never reaches storage, a download header or the audit trail.
 */
export const uploadFileName = z
  .string({ error: "fileName: give the file's name (?fileName=…)" })
  .trim()
  .min(1, "Give the file's name")
  .max(255, "At most 255 characters")
  .refine((v) => !/[\u0000-\u001f\u007f]/.test(v), "The file name holds control characters")
  .refine((v) => !/[\\/]/.test(v), "Give the file's own name, without folders (no / or \\)")
  .refine((v) => v !== "." && v !== "..", "Not a file name");
