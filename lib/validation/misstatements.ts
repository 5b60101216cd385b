import { z } from "zod";
import { moneyInput } from "./engagement";

/** A signed amount typed by a person (overstatement positive): up to 2 decimals, kept as a decimal string. */
export const signedMoneyInput = z
  .union([z.string(), z.number()])
  .transform((v) =>
    String(v)
      .trim()
      .replace(/[\s,]/g, "")
      .replace(/^\u2212/, "-"),
  )
  .refine(
    (v) => /^-?\d{1,16}(\.\d{1,2})?$/.test(v),
    "Enter an amount such as 12500, -12500 or 12500.50 (at most 2 decimals; minus for an understatement)",
  )
  .transform((v) => (v.includes(".") ? v : `${v}.00`));

const ymd = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Use the date form YYYY-MM-DD")
  .refine((v) => {
    const d = new Date(`${v}T00:00:00Z`);
    return !Number.isNaN(d.getTime()) && d.toISOString().startsWith(v);
  }, "Not a real date");

export const ENTRY_KINDS = ["factual", "judgemental", "prior-period"] as const;

export const CorrectionFields = z.object({
  on: ymd,
  reference: z.string().trim().min(1, "Name the client's adjustment (e.g. its journal number)").max(200),
});

export const EntrySchema = z.object({
  kind: z.enum(ENTRY_KINDS, "Choose factual, judgemental or prior period"),
  account: z.string().trim().min(2, "Name the account").max(200),
  assertion: z.string().trim().min(2, "Name the assertion").max(100),
  description: z.string().trim().min(3, "Describe the misstatement").max(4000),
  amount: signedMoneyInput,
  incomeEffect: signedMoneyInput,
  balanceEffect: signedMoneyInput,
  corrected: CorrectionFields.nullable().default(null),
});
export type EntryFormInput = z.input<typeof EntrySchema>;
export type Entry = z.output<typeof EntrySchema>;

export const EntryUpdateSchema = EntrySchema.extend({
  version: z.coerce.number().int().positive("Send the version you edited"),
});

export const SummarySettingsSchema = z.object({
  clearlyTrivial: moneyInput,
  approachingShare: z.coerce
    .number("Give the share as a number such as 0.75")
    .min(0.05, "At least 5 %")
    .max(1, "At most 100 %"),
});

export const SampleCorrectionSchema = z.object({
  sampleId: z.coerce.number().int().positive("Name the sample"),
  part: z.enum(["factual", "projected"], "Choose the factual or the projected part"),
  corrected: CorrectionFields.nullable(),
});

export const SummaryNoteSchema = z.object({ text: z.string().trim().min(3, "Write the review note").max(4000) });
export const SummarySignOffSchema = z.object({
  as: z.enum(["preparer", "reviewer"], "Sign off as preparer or reviewer"),
});
