import { z } from "zod";

/** "dot-decimal" reads 1,234.56; "comma-decimal" reads 1.234,56. */
export const numberFormatSchema = z.enum(["dot-decimal", "comma-decimal"]);
/** How 03/04/2024 is read; ISO dates (2024-04-03) need no choice. */
export const dateOrderSchema = z.enum(["day-first", "month-first"]);

const columnName = z.string().trim().min(1, "Choose a column").max(200);
/** Optional selects post "" for "none". */
const optionalColumnName = z
  .string()
  .trim()
  .max(200)
  .optional()
  .transform((value) => (value ? value : undefined));
const optionalChoice = <T extends z.ZodType>(schema: T) =>
  z.preprocess((value) => (value === "" || value === null ? undefined : value), schema.optional());

/**
 * How the columns of an uploaded ledger map onto population items. Columns are named by their
 * header text as shown on the mapping screen. Shared by the mapping form and the import route.
 */
export const populationMappingSchema = z
  .object({
    itemRefColumn: columnName,
    bookValueColumn: columnName,
    descriptionColumn: optionalColumnName,
    dateColumn: optionalColumnName,
    /** Other columns to keep with each item (stored as JSON). */
    extraColumns: z.array(columnName).max(50, "Keep at most 50 extra columns").default([]),
    /** Overrides the number format detected from the file. */
    numberFormat: optionalChoice(numberFormatSchema),
    /** Overrides the day/month order detected from the file. */
    dateOrder: optionalChoice(dateOrderSchema),
    /** XLSX only: the sheet to import (default: the first). */
    sheet: z.string().trim().min(1).max(31).optional(),
  })
  .superRefine((mapping, ctx) => {
    const roles: [string, string | undefined][] = [
      ["itemRefColumn", mapping.itemRefColumn],
      ["bookValueColumn", mapping.bookValueColumn],
      ["descriptionColumn", mapping.descriptionColumn],
      ["dateColumn", mapping.dateColumn],
    ];
    const used = new Map<string, string>();
    for (const [field, column] of roles) {
      if (!column) continue;
      const key = column.toLowerCase();
      if (used.has(key)) {
        ctx.addIssue({ code: "custom", path: [field], message: `"${column}" is already used as ${used.get(key)}` });
      } else used.set(key, field);
    }
    mapping.extraColumns.forEach((column, index) => {
      if (used.has(column.toLowerCase())) {
        ctx.addIssue({ code: "custom", path: ["extraColumns", index], message: `"${column}" is already mapped above` });
      }
    });
  });

export type PopulationMappingInput = z.input<typeof populationMappingSchema>;
export type PopulationMapping = z.output<typeof populationMappingSchema>;
