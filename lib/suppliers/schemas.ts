import { z } from "zod";
import { emailSchema } from "@/lib/auth/schemas";
import { promisedGradeSchema } from "@/lib/lots/schemas";

export const supplierSchema = z
  .object({
    name: z.string({ error: "Enter the supplier's name." }).trim().min(2, "Enter the supplier's name.").max(120, "Keep the name under 120 characters."),
    contactName: z
      .string()
      .trim()
      .max(120, "Keep the contact name under 120 characters.")
      .nullish()
      .transform((v) => v || null),
    contactEmail: emailSchema,
    notes: z.string().max(2000, "Keep notes under 2 000 characters.").optional().default(""),
    /** The grade this supplier's lots are bought at by default; null: the part type's. */
    promisedGrade: promisedGradeSchema.nullish().transform((v) => v ?? null),
  })
  .strict();
export type SupplierInput = z.infer<typeof supplierSchema>;

export const supplierUpdateSchema = supplierSchema
  .partial()
  .extend({ active: z.boolean({ error: "active must be true or false." }).optional() })
  .strict()
  .refine((v) => Object.keys(v).length > 0, "Nothing to change.");
export type SupplierUpdateInput = z.infer<typeof supplierUpdateSchema>;

/** GET /api/suppliers's query, and the Suppliers screen's URL (`/suppliers?search=…`). */
export const supplierListQuerySchema = z.object({ search: z.string().trim().max(100).optional() }).strict();
export type SupplierListParams = z.infer<typeof supplierListQuerySchema>;
