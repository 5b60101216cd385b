import { z } from "zod";
import { passwordInput } from "./user";

/** What the audit team can ask for on an item; "other" is described in the free text. */
export const REQUEST_NEEDS = [
  "invoice",
  "remittance",
  "confirmation",
  "delivery-note",
  "contract",
  "bank-statement",
  "other",
] as const;
export type RequestNeed = (typeof REQUEST_NEEDS)[number];

export const REQUEST_NEED_LABELS: Record<RequestNeed, string> = {
  invoice: "Sales or purchase invoice",
  remittance: "Remittance advice or proof of payment",
  confirmation: "Balance confirmation",
  "delivery-note": "Delivery note or proof of delivery",
  contract: "Contract or order",
  "bank-statement": "Bank statement extract",
  other: "Something else (described below)",
};

export const REQUEST_ITEM_STATUSES = ["requested", "provided", "accepted", "needs-more"] as const;
export type RequestItemStatus = (typeof REQUEST_ITEM_STATUSES)[number];

export const REQUEST_STATUS_LABELS: Record<RequestItemStatus, string> = {
  requested: "Requested",
  provided: "Provided",
  accepted: "Accepted",
  "needs-more": "Needs more",
};

const isoDay = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Use the date form YYYY-MM-DD")
  .refine((v) => {
    const d = new Date(`${v}T00:00:00Z`);
    return !Number.isNaN(d.getTime()) && d.toISOString().startsWith(v);
  }, "Not a real date");

const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `At most ${max} characters`)
    .optional()
    .transform((v) => (v ? v : undefined));

export const CreateRequestListSchema = z
  .object({
    title: z
      .string()
      .trim()
      .min(3, "Give the list a title of at least 3 characters")
      .max(200, "At most 200 characters"),
    contactUserId: z.coerce.number().int().positive("Choose the client contact"),
    dueDate: isoDay,
    showBookValues: z.boolean().default(false),
    message: optionalText(4000),
    /** "all" asks for every selected item (void ones excepted); otherwise the chosen item ids. */
    items: z.union([z.literal("all"), z.array(z.coerce.number().int().positive()).min(1, "Choose at least one item")]),
    needs: z
      .array(z.enum(REQUEST_NEEDS, "Choose what is needed from the list"))
      .min(1, "Choose at least one thing that is needed"),
    needsNote: optionalText(2000),
  })
  .refine((v) => !v.needs.includes("other") || Boolean(v.needsNote), {
    message: "Describe what else is needed",
    path: ["needsNote"],
  });
export type CreateRequestListInput = z.input<typeof CreateRequestListSchema>;
export type CreateRequestList = z.output<typeof CreateRequestListSchema>;

export const InviteClientContactSchema = z.object({
  name: z.string().trim().min(2, "Name needs at least 2 characters").max(200),
  email: z.string().trim().toLowerCase().email("Enter a valid e-mail address").max(254),
});
export type InviteClientContactInput = z.input<typeof InviteClientContactSchema>;

export const ReturnFileSchema = z.object({
  reason: z
    .string()
    .trim()
    .min(5, "Say what is missing or wrong, in at least 5 characters")
    .max(2000, "At most 2000 characters"),
});

export const ClientNoteSchema = z.object({
  note: z.string().trim().max(2000, "At most 2000 characters"),
});

export const AcceptInvitationSchema = z.object({
  password: passwordInput,
});
