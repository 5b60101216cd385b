import { z } from "zod";
import { FIRM_ROLES, GRADES } from "@/lib/auth/roles";

export const passwordInput = z
  .string()
  .min(12, "Passwords need at least 12 characters")
  .max(200, "Passwords are at most 200 characters");

export const CreateUserSchema = z.object({
  name: z.string().trim().min(2, "Name needs at least 2 characters").max(200),
  email: z.string().trim().toLowerCase().email("Enter a valid e-mail address").max(254),
  grade: z.enum(GRADES, "Choose a grade: staff, senior, manager, partner or client"),
  firmRole: z.enum(FIRM_ROLES).default("member"),
});
export type CreateUserInput = z.input<typeof CreateUserSchema>;
export type CreateUser = z.output<typeof CreateUserSchema>;

export const UpdateUserSchema = z
  .object({
    active: z.boolean(),
    grade: z.enum(GRADES),
    firmRole: z.enum(FIRM_ROLES),
    name: CreateUserSchema.shape.name,
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, "Send at least one field to change");
export type UpdateUser = z.output<typeof UpdateUserSchema>;

export const SignInSchema = z.object({
  email: z.string().trim().toLowerCase().email("Enter your e-mail address"),
  password: z.string().min(1, "Enter your password"),
});
