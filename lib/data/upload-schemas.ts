import "server-only";
import { z } from "zod";
import type { RowProblem, UploadInspection } from "@/lib/imports";

// The JSON a population upload stores (population_uploads.inspection_json and problems_json) and a
// loaded item keeps (population_items.extra), checked when read back.

const numberFormat = z.enum(["dot-decimal", "comma-decimal"]);

export const StoredInspectionSchema = z.looseObject({
  kind: z.enum(["csv", "xlsx"]),
  size: z.number(),
  encoding: z.enum(["utf-8", "utf-8-bom", "windows-1252"]).optional(),
  delimiter: z.enum([",", ";", "\t", "|"]).optional(),
  newline: z.enum(["\r\n", "\n", "\r"]).optional(),
  sheets: z.array(z.string()).optional(),
  sheet: z.string().optional(),
  date1904: z.boolean().optional(),
  headerRow: z.number(),
  headers: z.array(z.string()),
  autoNamedColumns: z.array(z.string()),
  headerFieldCount: z.number().nullable(),
  preview: z.array(z.array(z.string())),
  previewRowNumbers: z.array(z.number()),
  detectedNumberFormat: numberFormat.nullable(),
  columnNumberFormats: z.array(numberFormat.nullable()),
  detectedDateOrder: z.enum(["day-first", "month-first"]).nullable(),
  dataRows: z.number().optional(),
}) satisfies z.ZodType<UploadInspection>;

export const StoredProblemsSchema = z
  .array(z.looseObject({ row: z.number(), column: z.string().nullable(), reason: z.string() }))
  .nullable() satisfies z.ZodType<RowProblem[] | null>;

export const StoredExtraSchema = z.record(z.string(), z.string()).nullable();
