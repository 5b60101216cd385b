import { z } from "zod";

export const RaiseNoteSchema = z.object({
  text: z
    .string()
    .trim()
    .min(3, "Write the review note (at least 3 characters).")
    .max(4000, "Keep the note under 4,000 characters."),
  itemId: z.coerce.number().int().positive().optional(),
});
export const AnswerNoteSchema = z.object({
  answer: z
    .string()
    .trim()
    .min(1, "Write your answer before sending it.")
    .max(4000, "Keep the answer under 4,000 characters."),
});
export const UnlockSchema = z.object({
  reason: z.string().trim().min(10, "Give the reason for unlocking (at least 10 characters)").max(2000),
});
export const AuditQuerySchema = z.object({
  userId: z.coerce.number().int().positive().optional(),
  kind: z.enum(["all", "plan", "selection", "results", "evidence", "review", "lock"]).default("all"),
});
export type AuditQuery = z.output<typeof AuditQuerySchema>;
