import { z } from "zod";
import { ENGAGEMENT_ROLES } from "@/lib/auth/roles";

/** A money amount typed by a person: up to 2 decimals, kept as a decimal string (never a float). */
export const moneyInput = z
  .union([z.string(), z.number()])
  .transform((v) => String(v).trim().replace(/[\s,]/g, ""))
  .refine((v) => /^\d{1,16}(\.\d{1,2})?$/.test(v), "Enter an amount such as 125000 or 125000.50 (at most 2 decimals)")
  .transform((v) => (v.includes(".") ? v : `${v}.00`));

export const ENGAGEMENT_STATUSES = ["planning", "fieldwork", "completion", "archived"] as const;

const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Use the date form YYYY-MM-DD")
  .refine((v) => !/^\d{4}-\d{2}-\d{2}$/.test(v) || isRealDate(v), "Not a real date");

function isRealDate(v: string): boolean {
  const d = new Date(`${v}T00:00:00Z`);
  return !Number.isNaN(d.getTime()) && d.toISOString().startsWith(v);
}

const engagementFields = {
  clientName: z.string().trim().min(2, "Client name needs at least 2 characters").max(200),
  name: z.string().trim().min(2, "Engagement name needs at least 2 characters").max(200),
  periodEnd: isoDate,
  currency: z
    .string()
    .trim()
    .toUpperCase()
    .regex(/^[A-Z]{3}$/, "Use a 3-letter ISO 4217 code such as USD"),
  overallMateriality: moneyInput,
  performanceMateriality: moneyInput,
};

function centsOf(amount: string): bigint {
  const [whole, frac = ""] = amount.split(".");
  return BigInt(whole) * 100n + BigInt(frac.padEnd(2, "0"));
}

const materialityOrder = (v: { overallMateriality?: string; performanceMateriality?: string }) =>
  v.overallMateriality === undefined ||
  v.performanceMateriality === undefined ||
  centsOf(v.performanceMateriality) <= centsOf(v.overallMateriality);

const materialityIssue = {
  message: "Performance materiality cannot exceed overall materiality",
  path: ["performanceMateriality"],
};

export const CreateEngagementSchema = z.object(engagementFields).refine(materialityOrder, materialityIssue);
export type CreateEngagementInput = z.input<typeof CreateEngagementSchema>;
export type CreateEngagement = z.output<typeof CreateEngagementSchema>;

export const UpdateEngagementSchema = z
  .object({ ...engagementFields, status: z.enum(ENGAGEMENT_STATUSES) })
  .partial()
  .refine((v) => Object.keys(v).length > 0, "Send at least one field to change")
  .refine(materialityOrder, materialityIssue);
export type UpdateEngagement = z.output<typeof UpdateEngagementSchema>;

export const AddMemberSchema = z.object({
  userId: z.coerce.number().int().positive("Choose a person"),
  role: z.enum(ENGAGEMENT_ROLES, "Choose a role: viewer, staff, senior, manager or partner"),
});
export type AddMember = z.output<typeof AddMemberSchema>;

export const ChangeMemberRoleSchema = z.object({ role: AddMemberSchema.shape.role });
