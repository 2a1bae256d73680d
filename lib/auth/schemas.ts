/** zod schemas shared by sign-in, sign-up, invitations and password forms (client and server). */
import { z } from "zod";
import { EXAMPLE_PART_TYPE_SLUGS } from "@/lib/grading/example-part-types";
import { ROLES } from "./roles";

export const emailSchema = z
  .string({ error: "Enter an e-mail address." })
  .trim()
  .min(1, "Enter an e-mail address.")
  .max(254, "That e-mail address is too long.")
  .email("Enter a valid e-mail address, like name@company.example.")
  .transform((v) => v.toLowerCase());

export const personNameSchema = z.string({ error: "Enter a name." }).trim().min(1, "Enter a name.").max(120, "Keep the name under 120 characters.");

// Upper bound keeps hashing cheap for absurd inputs; 10 characters is our minimum.
export const newPasswordSchema = z.string({ error: "Enter a password." }).min(10, "Use at least 10 characters for the password.").max(200, "Keep the password under 200 characters.");

export const rolesSchema = z
  .array(z.enum(ROLES, { error: "Unknown role; choose inspector, trainer, auditor or lead." }), { error: "Choose at least one role." })
  .min(1, "Choose at least one role.")
  .max(ROLES.length)
  .transform((roles) => [...new Set(roles)]);

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string({ error: "Enter your password." }).min(1, "Enter your password.").max(200, "That password is too long."),
});

/** The password is chosen through the confirmation link (lib/accounts/sign-up.ts). */
export const signUpSchema = z.object({
  companyName: z.string({ error: "Enter the company name." }).trim().min(2, "Enter the company name.").max(120, "Keep the company name under 120 characters."),
  name: personNameSchema,
  email: emailSchema,
  /** Starter part types to create with the workspace (each with a draft example rubric). */
  starterPartTypes: z
    .array(z.enum(EXAMPLE_PART_TYPE_SLUGS, { error: `Starter part types are ${EXAMPLE_PART_TYPE_SLUGS.join(", ")}.` }), { error: "starterPartTypes is a list of starter part types." })
    .max(EXAMPLE_PART_TYPE_SLUGS.length)
    .default([]),
});
export type SignUpInput = z.infer<typeof signUpSchema>;

export const inviteSchema = z.object({ email: emailSchema, name: personNameSchema, roles: rolesSchema });
export type InviteInput = z.infer<typeof inviteSchema>;

export const updatePersonSchema = z
  .object({ name: personNameSchema, roles: rolesSchema, active: z.boolean({ error: "active must be true or false." }) })
  .partial()
  .refine((v) => Object.keys(v).length > 0, "Nothing to change: send name, roles or active.");
export type UpdatePersonInput = z.infer<typeof updatePersonSchema>;

export const forgotPasswordSchema = z.object({ email: emailSchema });

export const setPasswordSchema = z.object({
  token: z.string({ error: "The link is incomplete." }).min(20, "The link is incomplete.").max(200, "The link is not valid."),
  password: newPasswordSchema,
});
