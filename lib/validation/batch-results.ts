import { z } from "zod";

/**
 * Several items' results saved at once (a pasted column, "agreed to book" on selected rows, or the
 * undo of the last save). Each row is checked against SaveResultSchema on the server, so a refusal
 * names the item; this schema only fixes the envelope.
 */
export const BatchResultsSchema = z.object({
  rows: z
    .array(z.object({ itemId: z.coerce.number().int().positive() }).catchall(z.unknown()))
    .min(1, "Send at least one row")
    .max(500, "Send at most 500 rows at a time"),
});
export type BatchResults = z.output<typeof BatchResultsSchema>;
