import { z } from "zod";
import { signedMoney } from "./population";

/** What the team does when the computed result does not support the amount, or the limit is close to tolerable. */
export const RESPONSE_KINDS = [
  "extend",
  "alternative-procedures",
  "ask-client-to-adjust",
  "conclude-misstated",
] as const;
export type ResponseKind = (typeof RESPONSE_KINDS)[number];

export const RESPONSE_LABELS: Record<ResponseKind, string> = {
  extend: "Extend the sample",
  "alternative-procedures": "Perform alternative procedures",
  "ask-client-to-adjust": "Ask the client to adjust (amount)",
  "conclude-misstated": "Conclude the amount is misstated (amount, to the summary of misstatements)",
};

const NEEDS_AMOUNT: readonly ResponseKind[] = ["ask-client-to-adjust", "conclude-misstated"];

/** One response; the amount (overstatement positive, as misstatements elsewhere) for an adjustment or a misstatement. */
export const AuditorResponseSchema = z.object({
  kind: z.enum(
    RESPONSE_KINDS,
    "Choose extend, alternative procedures, ask the client to adjust, or conclude misstated",
  ),
  amount: signedMoney(16)
    .nullable()
    .optional()
    .transform((v) => v ?? null),
  note: z
    .string()
    .trim()
    .max(2000)
    .optional()
    .transform((v) => (v ? v : null)),
});
export type AuditorResponse = z.output<typeof AuditorResponseSchema>;
/** A response as stored (samples.auditor_responses_json): what AuditorResponseSchema gives. */
export const StoredAuditorResponseSchema = z.object({
  kind: z.enum(RESPONSE_KINDS),
  amount: z.string().nullable(),
  note: z.string().nullable(),
}) satisfies z.ZodType<AuditorResponse>;

export const AuditorConclusionSchema = z
  .object({
    conclusion: z.string().trim().min(10, "Write the conclusion in your own words (at least 10 characters)").max(4000),
    responses: z.array(AuditorResponseSchema).max(4, "At most one response of each kind").default([]),
  })
  .superRefine((c, ctx) => {
    c.responses.forEach((r, i) => {
      if (NEEDS_AMOUNT.includes(r.kind) && (r.amount === null || Number(r.amount) === 0))
        ctx.addIssue({ code: "custom", path: ["responses", i, "amount"], message: "Give the amount" });
      if (!NEEDS_AMOUNT.includes(r.kind) && r.amount !== null)
        ctx.addIssue({
          code: "custom",
          path: ["responses", i, "amount"],
          message: "Only an adjustment or a misstatement carries an amount",
        });
      if (c.responses.findIndex((o) => o.kind === r.kind) !== i)
        ctx.addIssue({ code: "custom", path: ["responses", i, "kind"], message: "Each kind of response once" });
    });
  });
export type AuditorConclusionInput = z.input<typeof AuditorConclusionSchema>;
export type AuditorConclusion = z.output<typeof AuditorConclusionSchema>;
