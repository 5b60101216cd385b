import { z } from "zod";
import { keysetFields } from "./keyset";
import { uploadFileName } from "./file-name";
import { populationMappingSchema } from "./population-mapping";
import { moneyInput } from "./engagement";

/** A money amount that may be negative (ledger control totals can be credits; DECIMAL(20,2)). */
export const signedMoneyInput = signedMoney(17);

/** A signed decimal amount typed by a person, kept as a 2-decimal string, with at most `wholeDigits` before the point. */
export function signedMoney(wholeDigits: number) {
  const pattern = new RegExp(`^-?\\d{1,${wholeDigits}}(\\.\\d{1,2})?$`);
  return z
    .union([z.string(), z.number()])
    .transform((v) => String(v).trim().replace(/[\s,]/g, ""))
    .refine((v) => pattern.test(v), "Enter an amount such as 1250.00 or -3200.50 (at most 2 decimals)")
    .transform((v) => (v.includes(".") ? v : `${v}.00`));
}

export const UploadQuerySchema = z.object({ fileName: uploadFileName });

export const InspectQuerySchema = z.object({ sheet: z.string().trim().min(1).max(31).optional() });

export const LoadPopulationSchema = z.object({
  name: z.string().trim().min(2, "Name the population (e.g. Trade receivables at 30 Sep 2026)").max(200),
  mapping: populationMappingSchema,
  supersedesId: z.coerce.number().int().positive().optional(),
});
export type LoadPopulation = z.output<typeof LoadPopulationSchema>;

export const ReconcileSchema = z.object({
  controlTotal: signedMoneyInput,
  controlCount: z.coerce
    .number({ error: "Enter the item count from the ledger" })
    .int("Whole items only")
    .min(0)
    .max(100_000_000),
  explanation: z
    .string()
    .trim()
    .max(4000)
    .optional()
    .transform((v) => (v ? v : undefined)),
});
export type ReconcileInput = z.input<typeof ReconcileSchema>;
export type Reconcile = z.output<typeof ReconcileSchema>;

export const ITEM_SORTS = ["row", "ref", "book"] as const;

/**
 * A page of a population's items. `after` / `before` (cursors from the previous answer) and `last`
 * page by key; `page` alone (no cursor) is the page number shown, and still seeks by offset for
 * callers that jump straight to page n.
 */
export const ItemsQuerySchema = z
  .object({
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(10).max(200).default(50),
    sort: z.enum(ITEM_SORTS).default("row"),
    dir: z.enum(["asc", "desc"]).default("asc"),
    q: z.string().trim().max(100).optional(),
    ...keysetFields,
  })
  .refine((q) => [q.after, q.before, q.last || undefined].filter(Boolean).length <= 1, {
    path: ["after"],
    message: "Give one of after, before or last",
  });
export type ItemsQuery = z.output<typeof ItemsQuerySchema>;

export const ProfileQuerySchema = z.object({ threshold: moneyInput.optional() });
