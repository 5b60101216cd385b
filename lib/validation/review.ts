import { z } from "zod";

export const RaiseNoteSchema = z.object({
  text: z.string().trim().min(3, "Write the review note").max(4000),
  itemId: z.coerce.number().int().positive().optional(),
});
export const AnswerNoteSchema = z.object({ answer: z.string().trim().min(3, "Write the answer").max(4000) });
export const UnlockSchema = z.object({ reason: z.string().trim().min(10, "Give the reason for unlocking (at least 10 characters)").max(2000) });
export const AuditQuerySchema = z.object({
  userId: z.coerce.number().int().positive().optional(),
  kind: z.enum(["all", "plan", "selection", "results", "evidence", "review", "lock"]).default("all"),
});
export type AuditQuery = z.output<typeof AuditQuerySchema>;
